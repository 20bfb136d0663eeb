import { createHash, randomUUID } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import pg from 'pg';
import { afterEach, describe, expect, it } from 'vitest';
import { createDatabase, type Database } from '../db';
import { AUDIT_ACTIONS } from './actions';
import { GENESIS_HASH } from './chain';
import { sealPending } from './sealer';
import { createTestClient } from '../../../../tests/support/audit-client';
import {
	createScratchDatabase,
	type ScratchDatabase
} from '../../../../tests/support/scratch-database';
import { anchorHead, listAnchors, memoryAnchorStore } from './anchors';
import { s3AnchorStore } from '../storage/anchors';
import { verifyAnchored, verifyChain } from './verify';
import { recordAccess, systemContext } from './writer';

// Each test works in a database of its own: tampering must not spoil the shared one.
let scratch: ScratchDatabase | undefined;
const extraPools: Database[] = [];
afterEach(async () => {
	await Promise.all(extraPools.splice(0).map((p) => p.$client.end()));
	await scratch?.drop();
	scratch = undefined;
});

async function fresh() {
	scratch = await createScratchDatabase('seal');
	return scratch;
}

async function writeRows(database: Database, count: number) {
	const clientId = await createTestClient(database);
	for (let i = 0; i < count; i++) {
		await recordAccess(
			database,
			{ ...systemContext, userId: randomUUID(), address: `192.0.2.${i % 250}` },
			{
				action: AUDIT_ACTIONS[i % AUDIT_ACTIONS.length]!,
				outcome: i % 3 === 0 ? 'refused' : 'success',
				target: { type: 'client', id: randomUUID() },
				clientId
			}
		);
	}
}

async function ids(s: ScratchDatabase): Promise<number[]> {
	const result = await s.asSuperuser((c) => c.query('select id from access_log order by id'));
	return result.rows.map((r) => Number(r.id));
}

/** Runs SQL as superuser with the append-only triggers off for that session only. */
function tamper(s: ScratchDatabase, ...statements: string[]) {
	return s.asSuperuser(async (c) => {
		await c.query('begin');
		await c.query('set local session_replication_role = replica');
		for (const statement of statements) await c.query(statement);
		await c.query('commit');
	});
}

describe('the sealer and the verifier', () => {
	it('seals every row in order and the chain verifies; the first link follows the documented format', async () => {
		const s = await fresh();
		await writeRows(s.app, 7);
		const result = await sealPending(s.app, { gapGraceMs: 0 });
		const all = await ids(s);
		expect(result).toMatchObject({ locked: true, sealed: 7, headRowId: all.at(-1) });
		expect(await sealPending(s.app, { gapGraceMs: 0 })).toMatchObject({ sealed: 0 });

		const report = await verifyChain(s.app);
		expect(report).toMatchObject({ ok: true, intact: true, rows: 7, sealed: 7, firstBroken: null });

		// Recompute the first link by hand: SHA-256 over the genesis hash followed by the
		// row's RFC 8785 JSON (keys sorted, `at` in epoch milliseconds).
		const { first, seal } = await s.asSuperuser(async (c) => {
			const row = await c.query(
				`select id, (extract(epoch from at) * 1000)::bigint::text as at_ms, * from access_log order by id limit 1`
			);
			const link = await c.query('select * from access_log_seals order by row_id limit 1');
			return { first: row.rows[0], seal: link.rows[0] };
		});
		const json =
			`{"action":${JSON.stringify(first.action)},"actor_organisation_id":null,` +
			`"actor_role":"system","actor_user_id":"${first.actor_user_id}",` +
			`"at":${first.at_ms},"client_address":"192.0.2.0","id":${Number(first.id)},` +
			`"outcome":"refused","subject_key":"${first.subject_key}",` +
			`"target_id":"${first.target_id}","target_type":"client","user_agent":null}`;
		expect(seal.prev_hash).toBe(GENESIS_HASH);
		expect(seal.hash).toBe(
			createHash('sha256')
				.update(GENESIS_HASH + json)
				.digest('hex')
		);
		expect(Number(first.at_ms)).toBe(new Date(first.at).getTime());
	});

	it('names a row altered with superuser rights', async () => {
		const s = await fresh();
		await writeRows(s.app, 6);
		await sealPending(s.app, { gapGraceMs: 0 });
		const all = await ids(s);
		await tamper(s, `update access_log set outcome = 'success' where id = ${all[3]}`);
		const report = await verifyChain(s.app);
		expect(report.intact).toBe(false);
		expect(report.firstBroken).toMatchObject({ rowId: all[3], problem: 'row-altered' });
	});

	it('names a deleted row', async () => {
		const s = await fresh();
		await writeRows(s.app, 6);
		await sealPending(s.app, { gapGraceMs: 0 });
		const all = await ids(s);
		await tamper(s, `delete from access_log where id = ${all[2]}`);
		expect((await verifyChain(s.app)).firstBroken).toMatchObject({
			rowId: all[2],
			problem: 'row-missing'
		});
	});

	it('names the first of two rows swapped in order', async () => {
		const s = await fresh();
		await writeRows(s.app, 6);
		await sealPending(s.app, { gapGraceMs: 0 });
		const [, b, c] = await ids(s);
		await tamper(
			s,
			`update access_log set id = -1 where id = ${b}`,
			`update access_log set id = ${b} where id = ${c}`,
			`update access_log set id = ${c} where id = -1`
		);
		expect((await verifyChain(s.app)).firstBroken).toMatchObject({
			rowId: b,
			problem: 'row-altered'
		});
	});

	it('names a removed seal, and a removed row together with its seal', async () => {
		const s = await fresh();
		await writeRows(s.app, 8);
		await sealPending(s.app, { gapGraceMs: 0 });
		const all = await ids(s);
		await tamper(s, `delete from access_log_seals where row_id = ${all[5]}`);
		expect((await verifyChain(s.app)).firstBroken).toMatchObject({
			rowId: all[5],
			problem: 'seal-missing'
		});
		await tamper(
			s,
			`delete from access_log_seals where row_id = ${all[1]}`,
			`delete from access_log where id = ${all[1]}`
		);
		// The next seal no longer chains from the one before it.
		expect((await verifyChain(s.app)).firstBroken).toMatchObject({
			rowId: all[2],
			problem: 'chain-broken'
		});
	});

	it('two sealers started at once make one chain, with no fork', async () => {
		const s = await fresh();
		const second = createDatabase(s.appUrl, { max: 5 });
		extraPools.push(second);
		const writers = [s.app, createDatabase(s.appUrl, { max: 2 })];
		extraPools.push(writers[1]!);
		let lockedOut = 0;
		for (let round = 0; round < 15; round++) {
			await Promise.all([writeRows(writers[0]!, 3), writeRows(writers[1]!, 3)]);
			const results = await Promise.all([
				sealPending(s.app, { gapGraceMs: 0, batchSize: 2 }),
				sealPending(second, { gapGraceMs: 0, batchSize: 2 }),
				sealPending(s.app, { gapGraceMs: 0, batchSize: 2 }),
				sealPending(second, { gapGraceMs: 0, batchSize: 2 })
			]);
			lockedOut += results.filter((r) => !r.locked).length;
		}
		// Whatever the interleaving, every row ends in the one chain.
		await sealPending(s.app, { gapGraceMs: 0 });
		const report = await verifyChain(s.app);
		expect(report).toMatchObject({ intact: true, rows: 90, sealed: 90 });
		// And the lock did turn sealers away (four at once, fifteen times).
		expect(lockedOut).toBeGreaterThan(0);
	});

	it('waits at a hole in the ids for a late commit, then seals in id order', async () => {
		const s = await fresh();
		const late = new pg.Client({ connectionString: s.appUrl });
		await late.connect();
		try {
			await writeRows(s.app, 2);
			await late.query('begin');
			const held = await late.query(
				`insert into access_log (action, outcome) values ('client.read', 'success') returning id`
			);
			await writeRows(s.app, 2);
			const first = await sealPending(s.app, { gapGraceMs: 10_000 });
			expect(first.sealed).toBe(2); // stops before the row still in flight
			await late.query('commit');
			const second = await sealPending(s.app, { gapGraceMs: 10_000 });
			expect(second.sealed).toBe(3);
			expect(second.headRowId).toBeGreaterThan(Number(held.rows[0].id));

			// A rolled-back insert leaves a hole for good: passed once the row after it is old enough.
			await late.query('begin');
			await late.query(
				`insert into access_log (action, outcome) values ('client.read', 'success') returning id`
			);
			await late.query('rollback');
			await writeRows(s.app, 1);
			expect((await sealPending(s.app, { gapGraceMs: 400 })).sealed).toBe(0);
			await new Promise((r) => setTimeout(r, 500));
			expect((await sealPending(s.app, { gapGraceMs: 400 })).sealed).toBe(1);

			// A row committing after the hole was passed can no longer be chained: verify says so.
			await late.query('begin');
			const tooLate = await late.query(
				`insert into access_log (action, outcome) values ('client.read', 'success') returning id`
			);
			await writeRows(s.app, 1);
			await new Promise((r) => setTimeout(r, 500));
			expect((await sealPending(s.app, { gapGraceMs: 400 })).sealed).toBe(1);
			await late.query('commit');
			expect((await verifyChain(s.app)).firstBroken).toMatchObject({
				rowId: Number(tooLate.rows[0].id),
				problem: 'seal-missing'
			});
		} finally {
			await late.end();
		}
	});

	it('reports rows left unsealed too long', async () => {
		const s = await fresh();
		await writeRows(s.app, 3);
		await sealPending(s.app, { gapGraceMs: 0 });
		await writeRows(s.app, 2);
		const fresh1 = await verifyChain(s.app, { staleAfterMs: 60_000 });
		expect(fresh1).toMatchObject({ ok: true, staleUnsealed: { count: 0 } });
		await new Promise((r) => setTimeout(r, 50));
		const stale = await verifyChain(s.app, { staleAfterMs: 10 });
		expect(stale).toMatchObject({ ok: false, intact: true, staleUnsealed: { count: 2 } });
	});

	it('`npm run audit:verify` reports intact, then the first broken link, by its exit code', async () => {
		const s = await fresh();
		await writeRows(s.app, 4);
		const run = () =>
			spawnSync(process.execPath, ['scripts/audit-verify.mjs', '--seal'], {
				env: { ...process.env, DATABASE_URL: s.appUrl },
				encoding: 'utf8'
			});
		const good = run();
		expect(good.stdout).toMatch(/sealed 4 row\(s\)[\s\S]*intact: 4 link\(s\) verified/);
		expect(good.status).toBe(0);
		const all = await ids(s);
		await tamper(s, `update access_log set target_type = 'referral' where id = ${all[1]}`);
		const bad = run();
		expect(bad.stdout).toContain(`BROKEN at row ${all[1]} (row-altered)`);
		expect(bad.status).toBe(1);
	}, 120_000); // two runs of a tsx script: slow on a busy machine

	it('`npm run audit:verify` anchors the head in the anchor bucket and names a cut tail', async () => {
		const s = await fresh();
		await writeRows(s.app, 5);
		const run = () =>
			spawnSync(process.execPath, ['scripts/audit-verify.mjs', '--seal'], {
				env: { ...process.env, DATABASE_URL: s.appUrl },
				encoding: 'utf8'
			});
		const good = run();
		expect(good.stdout).toMatch(/intact: 5 link\(s\) verified[\s\S]*1 anchored head\(s\) checked/);
		const all = await ids(s);
		const anchored = await listAnchors(s.app, s3AnchorStore);
		expect(anchored.map((a) => a.rowId)).toEqual([all[4]]);
		// A second anchor of the same head is not written again (create-only keys).
		expect(await s3AnchorStore.create(anchored[0]!.key, '{}')).toBe(false);

		await tamper(
			s,
			`delete from access_log where id > ${all[2]}`,
			`delete from access_log_seals where row_id > ${all[2]}`
		);
		const bad = run();
		expect(bad.stdout).toContain(`rows after #${all[2]} are missing; anchored head at #${all[4]}`);
		expect(bad.status).toBe(1);
	}, 120_000); // two runs of a tsx script: slow on a busy machine
});

describe('anchored heads', () => {
	/** Six sealed rows with their head anchored; returns the ids and the store. */
	async function anchoredLog(count = 6) {
		const s = await fresh();
		await writeRows(s.app, count);
		await sealPending(s.app, { gapGraceMs: 0 });
		const store = memoryAnchorStore();
		await anchorHead(s.app, store);
		return { s, store, all: await ids(s) };
	}

	it('a cut tail (rows and seals removed by a superuser) verifies alone but not against the anchor', async () => {
		const { s, store, all } = await anchoredLog();
		await tamper(
			s,
			`delete from access_log where id > ${all[3]}`,
			`delete from access_log_seals where row_id > ${all[3]}`
		);
		expect((await verifyChain(s.app)).intact).toBe(true);
		const report = await verifyAnchored(s.app, store);
		expect(report.firstBroken).toMatchObject({ rowId: all[4], problem: 'rows-missing' });
		expect(report.firstBroken!.detail).toMatch(
			new RegExp(
				`^rows after #${all[3]} are missing; anchored head at #${all[5]} \\(anchored \\d{4}-`
			)
		);
	});

	it('a chain re-sealed after an edited row verifies alone but not against the anchor', async () => {
		const { s, store, all } = await anchoredLog();
		await tamper(
			s,
			`update access_log set outcome = 'success', action = 'client.listed' where id = ${all[2]}`,
			`delete from access_log_seals where row_id >= ${all[2]}`
		);
		await sealPending(s.app, { gapGraceMs: 0 });
		expect((await verifyChain(s.app)).intact).toBe(true);
		const report = await verifyAnchored(s.app, store);
		expect(report.firstBroken).toMatchObject({ rowId: all[5], problem: 'anchor-mismatch' });
		expect(report.firstBroken!.detail).toContain('re-sealed');
	});

	it.each([
		[
			'an altered row',
			(all: number[]) => [`update access_log set client_address = '10.0.0.1' where id = ${all[2]}`],
			2,
			'row-altered'
		],
		[
			'a deleted middle row',
			(all: number[]) => [`delete from access_log where id = ${all[3]}`],
			3,
			'row-missing'
		],
		[
			'reordered rows',
			(all: number[]) => [
				`update access_log set id = -1 where id = ${all[1]}`,
				`update access_log set id = ${all[1]} where id = ${all[2]}`,
				`update access_log set id = ${all[2]} where id = -1`
			],
			1,
			'row-altered'
		],
		[
			'a cut tail',
			(all: number[]) => [
				`delete from access_log where id >= ${all[4]}`,
				`delete from access_log_seals where row_id >= ${all[4]}`
			],
			4,
			'rows-missing'
		]
	])(
		'names the first broken row after %s, walking in small batches',
		async (_what, statements, index, problem) => {
			const { s, store, all } = await anchoredLog(7);
			await tamper(s, ...statements(all));
			const report = await verifyAnchored(s.app, store, { batchSize: 2 });
			expect(report.firstBroken).toMatchObject({ rowId: all[index], problem });
			expect(report.intact).toBe(false);
		}
	);

	it('walks a long log in batches and reports its speed', async () => {
		const { s, store } = await anchoredLog(25);
		const report = await verifyAnchored(s.app, store, { batchSize: 4 });
		expect(report).toMatchObject({ intact: true, sealed: 25, anchoredHeads: 1 });
		expect(report.rowsPerSecond).toBeGreaterThan(0);
		expect(report.headHash).toMatch(/^[0-9a-f]{64}$/);
	});
});
