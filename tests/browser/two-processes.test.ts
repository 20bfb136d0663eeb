import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes, randomUUID } from 'node:crypto';
import { createServer } from 'node:net';
import { expect, test } from './support/test';
import { inbox, sql } from './support/signin';

// Two app processes from the same build on one database, as any load-balanced deployment runs
// them (beside the suite's own app, so three in all): a session made on one is valid on the
// other; every mail in the outbox is delivered exactly once though every process runs an
// outbox worker; and with every process running a sealer, the access log's seal chain stays
// one chain, verified by the app itself.

function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const { port } = server.address() as { port: number };
			server.close(() => resolve(port));
		});
	});
}

async function startApp(buildDir: string): Promise<{ origin: string; child: ChildProcess }> {
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const child = spawn(process.execPath, [buildDir], {
		env: { ...process.env, PORT: String(port), ORIGIN: origin },
		stdio: ['ignore', 'ignore', 'ignore']
	});
	await expect
		.poll(
			async () => {
				if (child.exitCode !== null) throw new Error('app exited early');
				return fetch(`${origin}/healthz`).then(
					(r) => r.status,
					() => 0
				);
			},
			{ timeout: 60_000 }
		)
		.toBe(200);
	return { origin, child };
}

async function sessionFor(email: string): Promise<string> {
	const token = randomBytes(32).toString('hex');
	await sql(
		`insert into sessions (session_token, user_id, expires)
		 select $1, id, now() + interval '1 hour' from users where email = $2`,
		[token, email]
	);
	return `authjs.session-token=${token}`;
}

test('two app processes share sessions, send each mail once and keep one seal chain', async () => {
	test.setTimeout(180_000);
	const buildDir = process.env.APP_BUILD_DIR;
	if (!buildDir) throw new Error('APP_BUILD_DIR is not set: run browser tests through `npm test`');
	const apps = [await startApp(buildDir), await startApp(buildDir)];
	try {
		// Sessions: made once, valid on both.
		const instructor = await sessionFor('instructor@studio.example');
		for (const app of apps) {
			const me = await fetch(`${app.origin}/api/v1/me`, { headers: { cookie: instructor } });
			expect(me.status).toBe(200);
			expect(((await me.json()) as { email: string }).email).toBe('instructor@studio.example');
		}

		// Mail: twelve queued at once wake every worker; each address gets exactly one.
		const run = randomUUID().slice(0, 8);
		const addresses = Array.from({ length: 12 }, (_, i) => `two-${run}-${i}@test.example`);
		await sql(
			`insert into outbox ("to", subject, text, kind)
			 select a, 'Two processes', 'One of twelve, sent once.', 'test.two-processes'
			 from unnest($1::text[]) a`,
			[addresses]
		);
		await expect
			.poll(
				async () =>
					(
						await sql<{ n: number }>(
							`select count(*)::int as n from outbox where "to" = any($1) and state = 'sent'`,
							[addresses]
						)
					)[0]!.n,
				{ timeout: 60_000 }
			)
			.toBe(addresses.length);
		for (const address of addresses) {
			expect((await inbox(address)).length, address).toBe(1);
		}

		// The seal chain: reads on both processes, every row sealed, the chain verified intact.
		for (const app of apps) {
			for (let i = 0; i < 5; i++) {
				const list = await fetch(`${app.origin}/api/v1/clients?limit=5`, {
					headers: { cookie: instructor }
				});
				expect(list.status).toBe(200);
			}
		}
		// Every row up to the last of these reads gets sealed by one of the three sealers …
		const [last] = await sql<{ id: string }>(`select max(id)::text as id from access_log`);
		await expect
			.poll(
				async () =>
					(
						await sql<{ n: number }>(
							`select count(*)::int as n from access_log l where l.id <= $1
							 and not exists (select 1 from access_log_seals s where s.row_id = l.id)`,
							[last!.id]
						)
					)[0]!.n,
				{ timeout: 90_000, intervals: [1000] }
			)
			.toBe(0);
		// … and the app's own verification walks one intact chain through them.
		const admin = await sessionFor('admin@studio.example');
		const verified = await fetch(`${apps[1]!.origin}/api/v1/audit/verify`, {
			method: 'POST',
			headers: { cookie: admin, origin: apps[1]!.origin }
		});
		expect(verified.status).toBe(200);
		const report = (await verified.json()) as { ok: boolean; headRowId: number };
		expect(report.ok).toBe(true);
		expect(report.headRowId).toBeGreaterThanOrEqual(Number(last!.id));
		const forks = await sql<{ n: number }>(
			`select count(*)::int as n from access_log_seals s
			 join lateral (select hash from access_log_seals p where p.row_id < s.row_id
				order by p.row_id desc limit 1) prev on true
			 where s.prev_hash <> prev.hash`
		);
		expect(forks[0]!.n).toBe(0);
	} finally {
		for (const app of apps) app.child.kill('SIGTERM');
	}
});
