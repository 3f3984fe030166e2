// Walks every server route file and checks that it is guarded: statically (each load, action and
// handler calls a guard) and over HTTP (anonymous callers are sent to sign-in or get 401, and a
// signed-in user with no role on a cruise is refused every cruise route and action).
import { eq } from 'drizzle-orm';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDb } from '../../src/lib/server/db/client';
import { cruise, vessel } from '../../src/lib/server/db/schema';
import { DEMO, formPost, signIn, startServer, type TestServer } from '../support/server';

const ROUTES = 'src/routes';
const SERVER_FILES = ['+page.server.ts', '+server.ts', '+layout.server.ts'];

/** Route files open to anyone (paths under src/routes), each with the reason. */
const PUBLIC: Record<string, string> = {
	'+page.server.ts': 'only redirects to sign-in or the cruise list',
	'(auth)/signin/+page.server.ts': 'the door itself',
	'(auth)/reset/+page.server.ts': 'asking for a reset link',
	'(auth)/reset/[token]/+page.server.ts': 'the single-use token is the credential',
	'(auth)/invite/[token]/+page.server.ts': 'the single-use token is the credential',
	'api/[...rest]/+server.ts': 'answers 404 for unknown API paths',
	'api/v1/payments/webhook/+server.ts':
		'the payment service calls it; the signature over the raw body is the credential',
	'(auth)/unsubscribe/[token]/+page.server.ts':
		'RFC 8058 one-click unsubscribe works without signing in; the single-use token is the credential',
	'(auth)/unsubscribe/[token]/+server.ts': 'the one-click POST of RFC 8058, token as credential'
};

interface RouteFile {
	file: string;
	rel: string;
	route: string;
	kind: string;
	source: string;
}

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		return statSync(p).isDirectory() ? walk(p) : [p];
	});
}

const files: RouteFile[] = walk(ROUTES)
	.filter((p) => SERVER_FILES.some((f) => p.endsWith(sep + f)))
	.map((file) => {
		const parts = relative(ROUTES, file).split(sep);
		const kind = parts.pop()!;
		const route = '/' + parts.filter((s) => !/^\(.*\)$/.test(s)).join('/');
		return {
			file,
			rel: [...parts, kind].join('/'),
			route,
			kind,
			source: readFileSync(file, 'utf8')
		};
	});

/** The bodies of exported loads/handlers and of each named action. */
function entryPoints(source: string): { name: string; body: string }[] {
	const out: { name: string; body: string }[] = [];
	const exports = [...source.matchAll(/export const (load|GET|POST|PUT|PATCH|DELETE|fallback)\b/g)];
	for (const m of exports) {
		const start = m.index!;
		const next = source.indexOf('\nexport ', start + 1);
		out.push({ name: m[1], body: source.slice(start, next === -1 ? undefined : next) });
	}
	const actionsAt = source.indexOf('export const actions');
	if (actionsAt !== -1) {
		const block = source.slice(actionsAt);
		const keys = [...block.matchAll(/\n\t(\w+): (?:async )?\(/g)];
		keys.forEach((k, i) => {
			const end = i + 1 < keys.length ? keys[i + 1].index : block.length;
			out.push({ name: `action ${k[1]}`, body: block.slice(k.index, end) });
		});
	}
	return out;
}

describe('every route file is guarded (static)', () => {
	it('finds the route files', () => {
		expect(files.length).toBeGreaterThan(15);
	});
	for (const f of files) {
		if (PUBLIC[f.rel] !== undefined) continue;
		it(`${f.route} ${f.kind}`, () => {
			const points = entryPoints(f.source);
			expect(points.length, 'no load, action or handler found').toBeGreaterThan(0);
			for (const p of points)
				expect(p.body, `${p.name} calls no guard`).toMatch(/guards\.require\w+\(/);
		});
	}
	it('public route files are only the listed ones and say why in the file', () => {
		const found = files.filter((x) => PUBLIC[x.rel] !== undefined);
		expect(found.map((f) => f.rel).sort()).toEqual(Object.keys(PUBLIC).sort());
		for (const f of found) expect(f.source, f.file).toMatch(/\/\/ Public/);
	});
});

describe('every route refuses callers without authority (HTTP)', () => {
	let srv: TestServer;
	let outsider: string; // signed in, but holds no role on the demo cruise
	let params: Record<string, string>;

	beforeAll(async () => {
		srv = await startServer();
		const db = openDb(srv.dbPath);
		params = {
			'[id]': db.select().from(cruise).where(eq(cruise.code, 'MT27-03')).get()!.id,
			vessel: db.select().from(vessel).get()!.id
		};
		db.$client.close();
		// asha.lindqvist is chief scientist of the other cruise only.
		outsider = (await signIn(srv.url, 'asha.lindqvist@example.org', DEMO.password)).cookie!;
	});
	afterAll(async () => srv?.stop());

	const concrete = (route: string) =>
		route.startsWith('/admin/vessels/[id]')
			? route.replace('[id]', params.vessel)
			: route.replace('[id]', params['[id]']).replace('[token]', 'x').replace('[...rest]', 'x');

	const pages = () => files.filter((f) => PUBLIC[f.rel] === undefined);

	it('anonymous GETs go to sign-in (pages) or get 401 JSON (API)', async () => {
		for (const f of pages()) {
			if (f.kind === '+server.ts' && !/export const GET/.test(f.source)) continue;
			const res = await fetch(srv.url + concrete(f.route), { redirect: 'manual' });
			if (f.route.startsWith('/api/')) {
				expect(res.status, f.route).toBe(401);
				expect((await res.json()).error.code).toBe('unauthenticated');
			} else {
				expect(res.status, f.route).toBe(303);
				expect(res.headers.get('location'), f.route).toMatch(/^\/signin/);
			}
		}
	});

	it('anonymous form actions are refused', async () => {
		for (const f of pages().filter((x) => x.kind === '+page.server.ts')) {
			for (const p of entryPoints(f.source).filter((e) => e.name.startsWith('action'))) {
				const name = p.name.slice('action '.length);
				const action = name === 'default' ? '' : `?/${name}`;
				const res = await formPost(srv.url, concrete(f.route) + action, {});
				expect(res.status, `${f.route} ${name}`).toBe(303);
				expect(res.headers.get('location'), `${f.route} ${name}`).toMatch(/^\/signin/);
			}
		}
	});

	it('a member with no role on the cruise is refused every cruise route and action', async () => {
		const cruiseFiles = pages().filter((f) => f.route.includes('/cruises/[id]'));
		expect(cruiseFiles.length).toBeGreaterThan(3);
		for (const f of cruiseFiles) {
			const url = srv.url + concrete(f.route);
			if (f.kind !== '+server.ts' || /export const GET/.test(f.source)) {
				const res = await fetch(url, { redirect: 'manual', headers: { cookie: outsider } });
				expect(res.status, `GET ${f.route}`).toBe(403);
			}
			for (const p of entryPoints(f.source).filter((e) => e.name.startsWith('action'))) {
				const name = p.name.slice('action '.length);
				const res = await formPost(
					srv.url,
					concrete(f.route) + (name === 'default' ? '' : `?/${name}`),
					{ email: 'x@example.org', role: 'chief_scientist', userId: 'x' },
					{ cookie: outsider }
				);
				expect(res.status, `POST ${f.route} ${name}`).toBe(403);
			}
		}
	});

	it('a member the marine office has not allowed to lead cruises may not create one', async () => {
		const participant = (await signIn(srv.url, DEMO.participant, DEMO.password, '10.0.0.77'))
			.cookie!;
		const page = await fetch(srv.url + '/cruises/new', {
			redirect: 'manual',
			headers: { cookie: participant }
		});
		expect(page.status).toBe(403);
		const post = await formPost(
			srv.url,
			'/cruises/new',
			{ code: 'NOPE-1', title: 'Not allowed', allocatedDays: '3' },
			{ cookie: participant }
		);
		expect(post.status).toBe(403);
	});

	it('a member who is not an admin is refused every admin page and action', async () => {
		for (const f of pages().filter((x) => x.route.startsWith('/admin'))) {
			const url = srv.url + concrete(f.route);
			const res = await fetch(url, { redirect: 'manual', headers: { cookie: outsider } });
			expect(res.status, f.route).toBe(403);
			for (const p of entryPoints(f.source).filter((e) => e.name.startsWith('action'))) {
				const name = p.name.slice('action '.length);
				const post = await formPost(
					srv.url,
					concrete(f.route) + (name === 'default' ? '' : `?/${name}`),
					{},
					{ cookie: outsider }
				);
				expect(post.status, `POST ${f.route} ${name}`).toBe(403);
			}
		}
	});
});
