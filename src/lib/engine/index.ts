/**
 * Wakeline's computation engine: pure TypeScript, no framework, DOM or environment imports, so
 * the same code runs in the browser and on the server. Metres, kilometres, Myr and degrees
 * inside; nautical miles and knots only at the edges.
 */
export * from './geodesy';
export * from './age';
export * from './depth';
export * from './melt';
export * from './survey';
export * from './iho';
export * from './soundspeed';
export * from './stations';
export * from './time';
export * from './polarity';
export * from './profile';
