// `npm run token -- <email>`: prints a fresh personal API token for that user (operators' scripts).
import { eq } from 'drizzle-orm';
import { createApiToken } from '../src/lib/server/auth';
import { config } from '../src/lib/server/config';
import { migrateDb, openDb } from '../src/lib/server/db/client';
import { user } from '../src/lib/server/db/schema';

const email = process.argv[2]?.trim().toLowerCase();
if (!email) {
	console.error('Usage: npm run token -- <email>');
	process.exit(2);
}
const db = openDb(config.databasePath);
migrateDb(db);
const u = db.select().from(user).where(eq(user.email, email)).get();
if (!u) {
	console.error(`No account with the e-mail ${email} in ${config.databasePath}.`);
	process.exit(1);
}
const { token } = createApiToken(db, u.id, `cli ${new Date().toISOString().slice(0, 16)}`);
console.log(token);
