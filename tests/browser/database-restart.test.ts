import { randomUUID } from 'node:crypto';
import { expect, test } from './support/test';
import { signIn, sql } from './support/signin';
// The same helpers `npm start` and `npm test` use to run PostgreSQL.
import {
	ensurePostgresInstalled,
	startPostgres,
	stopPostgres
} from '../../scripts/lib/postgres.mjs';

// A PostgreSQL restart under a bounded load, against the built app: the app must stay up,
// answer what it cannot do with a 503 problem, serve again within 5 s of the database
// accepting connections, and keep every change it acknowledged.

const WORKERS = 6;
const RECOVERY_MS = 5_000;

interface Tally {
	acknowledged: string[];
	statuses: Map<number, number>;
	unexpected: string[];
	appDown: number;
	firstOkAt: (after: number) => number | null;
}

function requireEnv(name: string): string {
	const value = process.env[name];
	if (!value) throw new Error(`${name} is not set: run browser tests through \`npm test\``);
	return value;
}

test('a PostgreSQL restart under load: 503s, recovery within 5 s, no acknowledged write lost', async ({
	page,
	baseURL
}) => {
	test.setTimeout(120_000);
	const dataDir = requireEnv('PGDATA_DIR');
	const port = requireEnv('PGPORT');
	const bin = ensurePostgresInstalled(() => {});

	// A studio and instructor of its own, so the records it writes change no other test's counts.
	const email = `restart-${randomUUID().slice(0, 8)}@test.example`;
	const [studio] = await sql<{ id: string }>(
		`insert into organisations (name, kind) values ('Restart Test Studio', 'studio') returning id`
	);
	const [user] = await sql<{ id: string }>(
		`insert into users (email, name) values ($1, 'Restart Tester') returning id`,
		[email]
	);
	await sql(
		`insert into memberships (user_id, organisation_id, role) values ($1, $2, 'instructor')`,
		[user!.id, studio!.id]
	);
	await signIn(page, email);
	const origin = new URL(baseURL!).origin;
	const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
	const tag = `Restart ${randomUUID().slice(0, 6)}`;

	const oks: number[] = [];
	const tally: Tally = {
		acknowledged: [],
		statuses: new Map(),
		unexpected: [],
		appDown: 0,
		firstOkAt: (after) => oks.find((t) => t >= after) ?? null
	};
	let running = true;
	let counter = 0;

	async function once(): Promise<void> {
		const write = counter++ % 2 === 0;
		const started = Date.now();
		let response: Response;
		try {
			response = write
				? await fetch(`${origin}/api/v1/clients`, {
						method: 'POST',
						headers: { cookie, origin, 'content-type': 'application/json' },
						body: JSON.stringify({
							name: `${tag} ${counter}`,
							stage: 'postpartum',
							birthDate: new Date(Date.now() - 60 * 86_400_000).toISOString().slice(0, 10),
							delivery: 'vaginal',
							births: 1,
							multiples: false
						}),
						signal: AbortSignal.timeout(15_000)
					})
				: await fetch(`${origin}/api/v1/clients?limit=5&search=${encodeURIComponent(tag)}`, {
						headers: { cookie },
						signal: AbortSignal.timeout(15_000)
					});
		} catch {
			tally.appDown++;
			await new Promise((r) => setTimeout(r, 50));
			return;
		}
		const body = await response.text();
		tally.statuses.set(response.status, (tally.statuses.get(response.status) ?? 0) + 1);
		if (response.ok) {
			oks.push(started);
			if (write) tally.acknowledged.push((JSON.parse(body) as { id: string }).id);
		} else if (
			response.status !== 503 ||
			!response.headers.get('content-type')?.includes('application/problem+json') ||
			!response.headers.get('retry-after')
		) {
			tally.unexpected.push(`${response.status} ${body.slice(0, 200)}`);
		} else {
			await new Promise((r) => setTimeout(r, 20));
		}
	}

	const load = Array.from({ length: WORKERS }, async () => {
		while (running) await once();
	});

	const waitFor = async (what: string, done: () => boolean, timeoutMs = 20_000) => {
		const deadline = Date.now() + timeoutMs;
		while (!done()) {
			if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
			await new Promise((r) => setTimeout(r, 25));
		}
	};

	try {
		await waitFor('writes under load', () => tally.acknowledged.length >= 10);
		stopPostgres({ bin, dataDir });
		await waitFor('503 answers while the database is down', () => tally.statuses.has(503));
		startPostgres({ bin, dataDir, port, throwaway: true, log: () => {} });
		const back = Date.now();
		await waitFor('the first 2xx after the restart', () => tally.firstOkAt(back) !== null, 15_000);
		const recovered = tally.firstOkAt(back)! - back;
		expect(recovered).toBeLessThan(RECOVERY_MS);
		// A little more load after recovery, then stop.
		const more = tally.acknowledged.length + 5;
		await waitFor('writes after recovery', () => tally.acknowledged.length >= more);
	} finally {
		running = false;
		await Promise.all(load);
	}

	expect(tally.appDown, 'requests the app did not answer at all').toBe(0);
	expect(tally.unexpected).toEqual([]);
	const stored = await sql<{ id: string }>('select id from clients where id = any($1::uuid[])', [
		tally.acknowledged
	]);
	expect(stored.length).toBe(tally.acknowledged.length);
	const health = await fetch(`${origin}/healthz`);
	expect(health.status).toBe(200);
});
