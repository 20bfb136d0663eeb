import { sql } from 'drizzle-orm';
import type { Database } from '../db';

// Anchored heads: copies of the chain's head `{ rowId, hash, sealedAt }` written outside the
// database, as objects in a bucket of their own. Whoever can rewrite the database (a
// superuser) can cut the newest rows with their seals, or edit a row and re-seal the chain
// from there: both leave a chain that holds on its own, but no longer passes through every
// anchored head. Anchors are only ever created, under a key naming the row and the hash, so
// no code path overwrites or deletes one (and in production the bucket's object lock refuses).

export interface Anchor {
	rowId: number;
	hash: string;
	sealedAt: string;
	anchoredAt: string;
}

/** Where anchors are kept: the storage module in the app, an in-memory map in unit tests. */
export interface AnchorStore {
	/** Creates the object unless the key exists; true when written. Never overwrites. */
	create(key: string, body: string): Promise<boolean>;
	list(prefix: string): Promise<string[]>;
	read(key: string): Promise<string>;
}

/**
 * The anchors of this database's chain, under `anchors/<database>-<oid>/`: a database made
 * anew (a fresh demo, a test's scratch database) starts a series of its own.
 */
export async function anchorPrefix(database: Database): Promise<string> {
	const result = await database.execute<{ name: string; oid: string }>(
		sql`select current_database() as name, oid::text as oid from pg_database where datname = current_database()`
	);
	const row = result.rows[0]!;
	return `anchors/${row.name}-${row.oid}/`;
}

const keyOf = (prefix: string, rowId: number, hash: string) =>
	`${prefix}${String(rowId).padStart(19, '0')}-${hash}.json`;

const KEY = /(\d{19})-([0-9a-f]{64})\.json$/;

/** The anchored heads named by the keys alone (row and hash), in row order. */
export async function listAnchors(
	database: Database,
	store: AnchorStore
): Promise<Array<{ rowId: number; hash: string; key: string }>> {
	const prefix = await anchorPrefix(database);
	return (await store.list(prefix))
		.map((key) => {
			const match = KEY.exec(key);
			return match ? { rowId: Number(match[1]), hash: match[2]!, key } : null;
		})
		.filter((a): a is { rowId: number; hash: string; key: string } => a !== null)
		.sort((a, b) => a.rowId - b.rowId);
}

export async function readAnchor(store: AnchorStore, key: string): Promise<Anchor> {
	return JSON.parse(await store.read(key)) as Anchor;
}

/**
 * Writes the chain's current head as an anchor (nothing when nothing is sealed yet or this
 * head is anchored already). Returns the head.
 */
export async function anchorHead(database: Database, store: AnchorStore): Promise<Anchor | null> {
	const head = await database.execute<{ row_id: string; hash: string; sealed_at: Date }>(
		sql`select s.row_id::text as row_id, s.hash, s.sealed_at from access_log_seals s order by s.row_id desc limit 1`
	);
	const row = head.rows[0];
	if (!row) return null;
	const anchor: Anchor = {
		rowId: Number(row.row_id),
		hash: row.hash,
		sealedAt: new Date(row.sealed_at).toISOString(),
		anchoredAt: new Date().toISOString()
	};
	const prefix = await anchorPrefix(database);
	await store.create(keyOf(prefix, anchor.rowId, anchor.hash), JSON.stringify(anchor));
	return anchor;
}

/** An in-memory store (create-only, like the bucket): for tests and scripts without S3. */
export function memoryAnchorStore(): AnchorStore & { objects: Map<string, string> } {
	const objects = new Map<string, string>();
	return {
		objects,
		async create(key, body) {
			if (objects.has(key)) return false;
			objects.set(key, body);
			return true;
		},
		async list(prefix) {
			return [...objects.keys()].filter((k) => k.startsWith(prefix)).sort();
		},
		async read(key) {
			const body = objects.get(key);
			if (body === undefined) throw new Error(`no anchor ${key}`);
			return body;
		}
	};
}
