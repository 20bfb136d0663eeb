import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalRow, GENESIS_HASH, linkHash, type ChainRow } from './chain';

// Hashing format of the seal chain. Check values are written out by hand from the rule in
// chain.ts: RFC 8785 (Rundgren, Jordan & Erdtman, 2020, JSON Canonicalization Scheme) sorts
// keys by UTF-16 code units and writes no whitespace; SHA-256 (FIPS 180-4) of prev ‖ JSON.

const row: ChainRow = {
	id: 42,
	at: Date.UTC(2025, 2, 4, 9, 15, 30, 123),
	actor_user_id: '6f1c8a52-3a1e-4c55-9a63-2a0f0d5e7b11',
	actor_role: 'physio',
	actor_organisation_id: null,
	action: 'document.downloaded',
	target_type: 'document',
	target_id: 'b7e0',
	subject_key: null,
	outcome: 'success',
	client_address: '198.51.100.4',
	user_agent: 'Agent "quoted" é'
};

describe('the seal chain format', () => {
	it('serialises a row as RFC 8785 JSON with `at` in epoch milliseconds', () => {
		expect(canonicalRow(row)).toBe(
			'{"action":"document.downloaded","actor_organisation_id":null,"actor_role":"physio",' +
				'"actor_user_id":"6f1c8a52-3a1e-4c55-9a63-2a0f0d5e7b11","at":1741079730123,' +
				'"client_address":"198.51.100.4","id":42,"outcome":"success","subject_key":null,' +
				'"target_id":"b7e0","target_type":"document","user_agent":"Agent \\"quoted\\" é"}'
		);
	});

	it('hashes the previous hash followed by the row, and chains', () => {
		const first = linkHash(GENESIS_HASH, row);
		expect(first).toBe(
			createHash('sha256')
				.update(GENESIS_HASH + canonicalRow(row))
				.digest('hex')
		);
		expect(first).toMatch(/^[0-9a-f]{64}$/);
		const second = linkHash(first, { ...row, id: 43 });
		expect(second).not.toBe(linkHash(GENESIS_HASH, { ...row, id: 43 }));
		// Any change to a field changes the hash.
		expect(linkHash(GENESIS_HASH, { ...row, outcome: 'refused' })).not.toBe(first);
	});
});
