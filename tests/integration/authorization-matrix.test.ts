// The authorization matrix: every page, form action and API endpoint found in src/routes,
// called as every demo actor and as an anonymous visitor, against the table in
// ./authorization-matrix.ts. A new route without a row fails the first test.
import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { eq, inArray, sql } from 'drizzle-orm';
import { createServer, type ViteDevServer } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { accessLog, sessions, users } from '../../src/lib/server/db/schema';
import { seedDemo } from '../../src/lib/server/demo/seed';
import { deactivateMember } from '../../src/lib/server/people/service';
import { callerFor, makePerson, makeSession } from './people-fixtures';
import { discoverEndpoints, type Endpoint } from './routes';
import {
	MATRIX as CORE_ROWS,
	PEOPLE,
	type Actor,
	type Expected,
	type Row
} from './authorization-matrix';
import { AUDIT_ROWS } from './matrix-rows/audit';
import { CLEARANCE_ROWS } from './matrix-rows/clearance';
import { CLIENT_ROWS } from './matrix-rows/clients';
import { DOCUMENT_ROWS } from './matrix-rows/documents';
import { PLAN_ROWS } from './matrix-rows/plans';
import { PRIVACY_ROWS } from './matrix-rows/privacy';
import { REFERRAL_ROWS } from './matrix-rows/referrals';
import { SELF_CARE_ROWS } from './matrix-rows/self-care';

// The table, by domain: the core (sign-in, dashboards, members) and each feature's rows.
const MATRIX: Row[] = [
	...CORE_ROWS,
	...CLIENT_ROWS,
	...REFERRAL_ROWS,
	...DOCUMENT_ROWS,
	...CLEARANCE_ROWS,
	...PLAN_ROWS,
	...AUDIT_ROWS,
	...PRIVACY_ROWS,
	...SELF_CARE_ROWS
];

const key = (e: Endpoint) => `${e.call.padEnd(18)} ${e.route}`;

/** Samples like `<client:Hana Lindqvist>` name a demo record; its id is looked up once. */
const sampleIds = new Map<string, string>();

async function resolveSamples(rows: Row[]): Promise<void> {
	for (const row of rows) {
		for (const value of Object.values(row.sample ?? {})) {
			const match = /^<(\w+):(.+)>$/.exec(value);
			if (!match || sampleIds.has(value)) continue;
			const [, kind, name] = match;
			const lookups: Record<string, ReturnType<typeof sql>> = {
				client: sql`select id from clients where name = ${name} limit 1`,
				// A demo client's referral (one each: see src/lib/server/demo/referrals.ts).
				referral: sql`select r.id from referrals r join clients c on c.id = r.client_id
					where c.name = ${name} limit 1`,
				// A demo document, by its file name (see src/lib/server/demo/documents.ts).
				document: sql`select id from documents where file_name = ${name}
					order by uploaded_at limit 1`,
				// A demo session plan, by its title (see src/lib/server/demo/plans.ts).
				plan: sql`select id from plans where title = ${name} limit 1`,
				// A demo request to erase data, by the client who asked (see demo/privacy.ts).
				erasure: sql`select e.id from erasure_requests e join clients c on c.id = e.client_id
					where c.name = ${name} limit 1`
			};
			const lookup = lookups[kind!];
			if (!lookup) throw new Error(`unknown sample kind ${kind}`);
			const found = await db().execute<{ id: string }>(lookup);
			if (!found.rows[0]) throw new Error(`no demo ${kind} named ${name}`);
			sampleIds.set(value, found.rows[0].id);
		}
	}
}

function pathOf(row: Row): string {
	let path = row.route.replace(/\/\([^)]+\)/g, '');
	path = path.replace(/\[(?:\.\.\.)?([^\]]+)\]/g, (_, name: string) => {
		const value = row.sample?.[name];
		if (!value) throw new Error(`row ${row.call} ${row.route} needs sample.${name}`);
		return encodeURIComponent(sampleIds.get(value) ?? value);
	});
	return path || '/';
}

let server: ViteDevServer;
let origin: string;
const cookies = new Map<Actor, string>();
let deactivatedCookie = '';
const userIds = new Map<Actor, string>();

beforeAll(async () => {
	const [known] = await db()
		.select({ id: users.id })
		.from(users)
		.where(eq(users.email, 'admin@studio.example'));
	if (!known) await seedDemo(db());
	await resolveSamples(MATRIX);
	const people = await db()
		.select({ id: users.id, email: users.email })
		.from(users)
		.where(inArray(users.email, [...PEOPLE]));
	for (const person of people) {
		const token = randomBytes(32).toString('hex');
		await db()
			.insert(sessions)
			.values({
				sessionToken: token,
				userId: person.id,
				expires: new Date(Date.now() + 30 * 60 * 1000)
			});
		cookies.set(person.email as Actor, `authjs.session-token=${token}`);
		userIds.set(person.email as Actor, person.id);
	}
	// A member of the demo studio who signed in and was then deactivated by the admin: the
	// cookie she still holds must open nothing (the 'deactivated' pseudo-actor below).
	const [studio] = await db()
		.execute<{ id: string }>(sql`select id from organisations where name = 'Linden Row Studio'`)
		.then((r) => r.rows);
	const leaver = await makePerson([{ organisationId: studio!.id, role: 'instructor' }]);
	const leaverToken = await makeSession(leaver.userId);
	await deactivateMember(
		await callerFor(userIds.get('admin@studio.example')!, studio!.id),
		leaver.membershipIds[0]!
	);
	deactivatedCookie = `authjs.session-token=${leaverToken}`;
	server = await createServer({
		configFile: 'vite.config.ts',
		logLevel: 'error',
		server: { host: '127.0.0.1', port: 0, strictPort: false, hmr: false, watch: null }
	});
	await server.listen();
	origin = `http://127.0.0.1:${(server.httpServer!.address() as AddressInfo).port}`;
	// The first request compiles the app; do it once before the timed calls.
	await fetch(`${origin}/`);
}, 120_000);

afterAll(async () => {
	await server?.close();
});

async function call(
	row: Row,
	actor: Actor | 'deactivated'
): Promise<{ status: number; location: string }> {
	const headers: Record<string, string> = { accept: 'text/html', origin };
	const cookie = actor === 'deactivated' ? deactivatedCookie : cookies.get(actor);
	if (cookie) headers.cookie = cookie;
	const path = pathOf(row);
	const init: RequestInit = { method: 'GET', headers, redirect: 'manual' };
	let url = `${origin}${path}`;
	if (row.call.startsWith('POST ?/')) {
		const action = row.call.slice('POST ?/'.length);
		url += action === 'default' ? '' : `?/${action}`;
		init.method = 'POST';
		headers['content-type'] = 'application/x-www-form-urlencoded';
		init.body = '';
	} else if (row.call !== 'GET') {
		init.method = row.call;
		headers['content-type'] = 'application/json';
		headers.accept = 'application/json';
		init.body = '{}';
	}
	if (row.route.startsWith('/api/')) headers.accept = 'application/json';
	const response = await fetch(url, init);
	await response.arrayBuffer();
	return { status: response.status, location: response.headers.get('location') ?? '' };
}

function matches(expected: Expected, got: { status: number; location: string }): boolean {
	if (expected === 'signin') return got.status === 303 && got.location.startsWith('/signin');
	if (expected === 'redirect') {
		return [302, 303].includes(got.status) && !got.location.startsWith('/signin?callbackUrl');
	}
	return got.status === expected;
}

async function refusalsOf(userId: string): Promise<number> {
	const [row] = await db()
		.select({ n: sql<number>`count(*)::int` })
		.from(accessLog)
		.where(sql`${accessLog.actorUserId} = ${userId} and ${accessLog.outcome} <> 'success'`);
	return row?.n ?? 0;
}

describe('authorization matrix', () => {
	it('has a row for every page, form action and endpoint in src/routes (and no stale rows)', () => {
		const inCode = new Set(discoverEndpoints().map(key));
		const inTable = new Set(MATRIX.map((r) => key(r)));
		const missing = [...inCode].filter((k) => !inTable.has(k)).sort();
		const stale = [...inTable].filter((k) => !inCode.has(k)).sort();
		expect(missing, 'routes without a row in authorization-matrix.ts').toEqual([]);
		expect(stale, 'rows for routes that no longer exist').toEqual([]);
	});

	it('answers every row as expected for every actor, and logs each refusal', async () => {
		const wrong: string[] = [];
		for (const row of MATRIX) {
			for (const actor of ['anonymous', ...PEOPLE] as Actor[]) {
				const expected = row.expect[actor];
				const userId = userIds.get(actor);
				// Every refusal to a signed-in person (404 not there, 403 not allowed) is in the log.
				const watched = expected === 404 || expected === 403 ? userId : undefined;
				const before = watched ? await refusalsOf(watched) : 0;
				const got = await call(row, actor);
				if (!matches(expected, got)) {
					wrong.push(
						`${row.call} ${pathOf(row)} as ${actor}: expected ${expected}, got ${got.status} ${got.location}`
					);
				} else if (watched && (await refusalsOf(watched)) <= before) {
					wrong.push(`${row.call} ${pathOf(row)} as ${actor}: refused but not in the access log`);
				}
			}
		}
		expect(wrong).toEqual([]);
	}, 300_000);

	it('a deactivated member’s old session cookie gets what an anonymous visitor gets, everywhere', async () => {
		const wrong: string[] = [];
		for (const row of MATRIX) {
			const got = await call(row, 'deactivated');
			if (!matches(row.expect.anonymous, got)) {
				wrong.push(
					`${row.call} ${pathOf(row)}: expected ${row.expect.anonymous}, got ${got.status} ${got.location}`
				);
			}
		}
		expect(wrong).toEqual([]);
	}, 300_000);
});
