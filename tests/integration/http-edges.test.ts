import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { and, eq, gte } from 'drizzle-orm';
import { createServer, type ViteDevServer } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { accessLog, sessions } from '../../src/lib/server/db/schema';
import { makeOrganisation, makePerson, makeSession } from './people-fixtures';

// The edges of the HTTP layer, through the app's own server (hooks, routes, services, the
// database): caching of authenticated answers, the same-origin rule for every change, bodies,
// unknown fields, and the user agent of data loaded through the API.

let server: ViteDevServer;
let origin: string;
let cookie: string;
let sessionToken: string;
let userId: string;

const day = (daysAgo: number) =>
	new Date(Date.now() - daysAgo * 86_400_000).toISOString().slice(0, 10);
const newClient = (name: string) => ({
	name,
	stage: 'postpartum',
	birthDate: day(60),
	delivery: 'vaginal',
	births: 1,
	multiples: false
});

beforeAll(async () => {
	const studio = await makeOrganisation('studio');
	const person = await makePerson([{ organisationId: studio, role: 'instructor' }]);
	userId = person.userId;
	sessionToken = await makeSession(person.userId);
	cookie = `authjs.session-token=${sessionToken}`;
	server = await createServer({
		configFile: 'vite.config.ts',
		logLevel: 'error',
		server: { host: '127.0.0.1', port: 0, strictPort: false, hmr: false, watch: null }
	});
	await server.listen();
	origin = `http://127.0.0.1:${(server.httpServer!.address() as AddressInfo).port}`;
	await fetch(`${origin}/`);
}, 120_000);

afterAll(async () => {
	await server?.close();
});

const json = (body: unknown) => ({
	method: 'POST',
	headers: { cookie, origin, 'content-type': 'application/json' },
	body: JSON.stringify(body)
});

async function createClient(name: string): Promise<string> {
	const res = await fetch(`${origin}/api/v1/clients`, json(newClient(name)));
	expect(res.status).toBe(201);
	return ((await res.json()) as { id: string }).id;
}

describe('caching', () => {
	it('every authenticated answer says Cache-Control: no-store — page, JSON and refusal', async () => {
		const id = await createClient(`Cache ${randomUUID().slice(0, 6)}`);
		for (const [path, accept] of [
			[`/clients/${id}`, 'text/html'],
			[`/api/v1/clients/${id}`, 'application/json'],
			['/api/v1/me', 'application/json'],
			['/clients', 'text/html'],
			[`/api/v1/clients/${randomUUID()}`, 'application/json']
		] as const) {
			const res = await fetch(`${origin}${path}`, { headers: { cookie, accept } });
			await res.arrayBuffer();
			expect(res.headers.get('cache-control'), path).toBe('no-store');
		}
	});

	it('over plain http there is no HSTS (it is sent over https only)', async () => {
		const res = await fetch(`${origin}/signin`);
		await res.arrayBuffer();
		expect(res.headers.get('strict-transport-security')).toBeNull();
	});
});

describe('the same-origin rule for every change', () => {
	it('a cross-origin sign-out with a JSON body is refused and the session lives on', async () => {
		const attempts: Record<string, string>[] = [
			{ origin: 'http://evil.example', 'content-type': 'application/json' },
			{ 'content-type': 'application/json' },
			{ origin: 'http://evil.example', 'content-type': 'text/plain' }
		];
		for (const headers of attempts) {
			const res = await fetch(`${origin}/auth/signout`, {
				method: 'POST',
				headers: { cookie, ...headers },
				body: '{}',
				redirect: 'manual'
			});
			await res.arrayBuffer();
			expect(res.status).toBe(403);
		}
		const [still] = await db()
			.select()
			.from(sessions)
			.where(eq(sessions.sessionToken, sessionToken));
		expect(still).toBeDefined();
		const me = await fetch(`${origin}/api/v1/me`, { headers: { cookie } });
		expect(me.status).toBe(200);
	});

	it('a cross-origin API change is a problem+json 403', async () => {
		const res = await fetch(`${origin}/api/v1/clients`, {
			...json(newClient('Foreign')),
			headers: { cookie, origin: 'http://evil.example', 'content-type': 'application/json' }
		});
		expect(res.status).toBe(403);
		expect(res.headers.get('content-type')).toContain('application/problem+json');
	});
});

describe('bodies and fields', () => {
	it('a POST that takes no body is accepted without a Content-Type', async () => {
		const res = await fetch(`${origin}/api/v1/consents/${randomUUID()}/withdraw`, {
			method: 'POST',
			headers: { cookie, origin }
		});
		await res.arrayBuffer();
		// Not 415: the request reaches the service, which knows no such consent.
		expect(res.status).toBe(404);
	});

	it('a body sent without a Content-Type is still refused (415)', async () => {
		const res = await fetch(`${origin}/api/v1/clients`, {
			method: 'POST',
			headers: { cookie, origin },
			body: new Blob([JSON.stringify(newClient('Typeless'))])
		});
		await res.arrayBuffer();
		expect(res.status).toBe(415);
	});

	it('an unknown field is refused on POST as on PATCH (422 at its pointer), nothing written', async () => {
		const name = `Unknown ${randomUUID().slice(0, 6)}`;
		const post = await fetch(
			`${origin}/api/v1/clients`,
			json({ ...newClient(name), nmae: 'typo', intakeConsent: null })
		);
		expect(post.status).toBe(422);
		const body = (await post.json()) as { errors: Array<{ pointer: string; message: string }> };
		expect(body.errors).toEqual([{ pointer: '/nmae', message: 'unknown field' }]);
		const list = await fetch(`${origin}/api/v1/clients?search=${encodeURIComponent(name)}`, {
			headers: { cookie }
		});
		expect(((await list.json()) as { items: unknown[] }).items).toEqual([]);

		const id = await createClient(`Patch ${randomUUID().slice(0, 6)}`);
		const patch = await fetch(`${origin}/api/v1/clients/${id}`, {
			...json({ nmae: 'typo' }),
			method: 'PATCH'
		});
		expect(patch.status).toBe(422);
		const patchBody = (await patch.json()) as { errors: Array<{ pointer: string }> };
		expect(patchBody.errors.map((e) => e.pointer)).toEqual(['/nmae']);
	});
});

// A malformed percent-encoding is tested against the built app (tests/browser/http-edges.test.ts):
// Vite's dev server refuses such a path itself, before the app sees it.

describe('the access log', () => {
	it('rows for data a page loads through the API keep the browser’s user agent', async () => {
		const name = `Agent ${randomUUID().slice(0, 6)}`;
		const id = await createClient(name);
		const since = new Date(Date.now() - 1000);
		const res = await fetch(`${origin}/clients?search=${encodeURIComponent(name)}`, {
			headers: { cookie, accept: 'text/html', 'user-agent': 'edge-browser/2.0' }
		});
		expect(res.status).toBe(200);
		await res.arrayBuffer();
		const rows = await db()
			.select()
			.from(accessLog)
			.where(
				and(
					eq(accessLog.actorUserId, userId),
					eq(accessLog.action, 'client.listed'),
					eq(accessLog.targetId, id),
					gte(accessLog.at, since)
				)
			);
		expect(rows.length).toBeGreaterThan(0);
		expect(rows.map((r) => r.userAgent)).toEqual(rows.map(() => 'edge-browser/2.0'));
	});
});
