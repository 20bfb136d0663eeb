import { DrizzleQueryError } from 'drizzle-orm/errors';
import { describe, expect, it } from 'vitest';
import { describeError, isDatabaseUnavailable, queryName } from './errors';

// What the server log may say about a failed query, and which errors mean "database gone".

describe('describing a failed query for the log', () => {
	it('names the query and its SQLSTATE, never its parameters nor PostgreSQL’s message', () => {
		const cause = Object.assign(new Error('invalid input syntax for type timestamp: "zzz"'), {
			code: '22007'
		});
		const error = new DrizzleQueryError(
			'select "id", "name" from "clients" where "clients"."name" ilike $1',
			['%Hana Lindqvist%', 'zzz'],
			cause
		);
		const line = describeError(error);
		expect(line).toBe('query select "clients" failed (code 22007)');
		expect(line).not.toContain('Hana');
		expect(line).not.toContain('zzz');
	});

	it('names statements by verb and first table', () => {
		expect(queryName('insert into "outbox" ("to") values ($1)')).toBe('insert "outbox"');
		expect(queryName('update outbox set state = $1')).toBe('update outbox');
		expect(queryName('begin')).toBe('begin');
	});
});

describe('telling a lost database from a bug', () => {
	it('a restart, a refused connection or a dropped one is "unavailable"', () => {
		const restart = Object.assign(
			new Error('terminating connection due to administrator command'),
			{
				code: '57P01'
			}
		);
		expect(isDatabaseUnavailable(restart)).toBe(true);
		expect(isDatabaseUnavailable(new DrizzleQueryError('select 1', [], restart))).toBe(true);
		expect(isDatabaseUnavailable(Object.assign(new Error('x'), { code: 'ECONNREFUSED' }))).toBe(
			true
		);
		expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true);
	});

	it('a constraint violation or a plain bug is not', () => {
		expect(isDatabaseUnavailable(Object.assign(new Error('dup'), { code: '23505' }))).toBe(false);
		expect(isDatabaseUnavailable(new TypeError('x is undefined'))).toBe(false);
	});
});
