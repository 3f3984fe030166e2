/**
 * Load run: `npm run load`. Starts the built app on a throwaway database (as the tests do), mints
 * an API token for the demo chief scientist and drives GET /api/v1/cruises/{id}/plan with 50
 * concurrent clients for 10 s (autocannon, loopback). Prints requests/s, p50/p99 and errors.
 * Target (issue 8): no errors, p99 < 250 ms. Point it at a running server instead with
 * LOAD_URL=http://host:port LOAD_TOKEN=wlt_… LOAD_CRUISE=<id>.
 */
import autocannon from 'autocannon';
import { execFileSync } from 'node:child_process';
import { eq } from 'drizzle-orm';
import { openDb } from '../src/lib/server/db/client';
import { cruise } from '../src/lib/server/db/schema';
import { DEMO, startServer } from '../tests/support/server';

const connections = Number(process.env.LOAD_CONNECTIONS || 50);
const duration = Number(process.env.LOAD_SECONDS || 10);

let url = process.env.LOAD_URL;
let token = process.env.LOAD_TOKEN;
let cruiseId = process.env.LOAD_CRUISE;
let stop = async () => {};
if (!url) {
	const srv = await startServer();
	stop = srv.stop;
	url = srv.url;
	token = execFileSync('npx', ['tsx', 'scripts/token.ts', DEMO.chief], {
		env: { ...process.env, DATABASE_PATH: srv.dbPath },
		encoding: 'utf8'
	}).trim();
	const db = openDb(srv.dbPath);
	cruiseId = db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id;
	db.$client.close();
}
const path = `/api/v1/cruises/${cruiseId}/plan`;
try {
	const warm = await fetch(url + path, { headers: { authorization: `Bearer ${token}` } });
	if (!warm.ok) throw new Error(`warm-up answered ${warm.status}: ${await warm.text()}`);
	const r = await autocannon({
		url: url + path,
		connections,
		duration,
		headers: { authorization: `Bearer ${token}` }
	});
	const non2xx = r.non2xx + r.errors + r.timeouts;
	console.log(
		`GET ${path} — ${connections} clients, ${duration} s\n` +
			`  requests/s  ${r.requests.average.toFixed(0)}  (${r.requests.total} requests)\n` +
			`  latency     p50 ${r.latency.p50} ms   p99 ${r.latency.p99} ms   max ${r.latency.max} ms\n` +
			`  errors      ${non2xx} (non-2xx ${r.non2xx}, errors ${r.errors}, timeouts ${r.timeouts})\n` +
			`  target      no errors, p99 < 250 ms: ${non2xx === 0 && r.latency.p99 < 250 ? 'met' : 'NOT met'}`
	);
} finally {
	await stop();
}
