import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { sql } from 'drizzle-orm';

// The access log's hash chain, shared by the sealer (which appends links) and the verifier
// (which walks them). Each link is
//
//   hash = hex(SHA-256(UTF-8(prev_hash ‖ canonical JSON of the row)))
//
// where prev_hash is the previous link's hash (GENESIS_HASH for the first row) and the
// canonical JSON is RFC 8785 (sorted keys, no whitespace) over the row's columns under their
// column names, with `at` as integer epoch milliseconds: the column has millisecond
// precision, so what PostgreSQL stores and what JavaScript hashes agree exactly.

/** The hash the first link chains from. */
export const GENESIS_HASH = '0'.repeat(64);

/** One access-log row as it is hashed. */
export interface ChainRow {
	id: number;
	at: number;
	actor_user_id: string | null;
	actor_role: string | null;
	actor_organisation_id: string | null;
	action: string;
	target_type: string | null;
	target_id: string | null;
	subject_key: string | null;
	outcome: string;
	client_address: string | null;
	user_agent: string | null;
}

/** The columns of access_log as ChainRow reads them (ids and `at` as text, converted below). */
export const chainColumns = sql.raw(
	[
		'l.id::text as id',
		`(extract(epoch from l.at) * 1000)::bigint::text as at`,
		'l.actor_user_id::text as actor_user_id',
		'l.actor_role',
		'l.actor_organisation_id::text as actor_organisation_id',
		'l.action',
		'l.target_type',
		'l.target_id',
		'l.subject_key::text as subject_key',
		'l.outcome',
		'l.client_address',
		'l.user_agent'
	].join(', ')
);

const text = (value: unknown): string | null => (value === null ? null : String(value));

/** Turns a result row selected with `chainColumns` into the row that is hashed. */
export function toChainRow(raw: Record<string, unknown>): ChainRow {
	return {
		id: Number(raw.id),
		at: Number(raw.at),
		actor_user_id: text(raw.actor_user_id),
		actor_role: text(raw.actor_role),
		actor_organisation_id: text(raw.actor_organisation_id),
		action: String(raw.action),
		target_type: text(raw.target_type),
		target_id: text(raw.target_id),
		subject_key: text(raw.subject_key),
		outcome: String(raw.outcome),
		client_address: text(raw.client_address),
		user_agent: text(raw.user_agent)
	};
}

export function canonicalRow(row: ChainRow): string {
	const json = canonicalize(row);
	if (json === undefined) throw new Error(`access_log row ${row.id} cannot be serialised`);
	return json;
}

export function linkHash(prevHash: string, row: ChainRow): string {
	return createHash('sha256')
		.update(prevHash + canonicalRow(row), 'utf8')
		.digest('hex');
}
