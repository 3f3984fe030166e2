import { config } from '../config';
import { openDb } from './client';

export const db = openDb(config.databasePath);
