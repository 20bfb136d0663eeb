// Telling a lost database from a bug, and describing a failed query without its values.

/** SQLSTATE classes and codes that mean "the database is not there right now". */
const UNAVAILABLE_CODES = new Set([
	'57P01', // admin_shutdown (a restart)
	'57P02', // crash_shutdown
	'57P03', // cannot_connect_now (starting up or shutting down)
	'53300' // too_many_connections
]);
const UNAVAILABLE_NODE_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH'
]);
const UNAVAILABLE_MESSAGES = [
	'Connection terminated',
	'connection error and is not queryable',
	'timeout exceeded when trying to connect',
	'Client was closed and is not queryable'
];

function* causes(error: unknown): Generator<unknown> {
	for (let e = error, depth = 0; e && depth < 6; depth++) {
		yield e;
		e = (e as { cause?: unknown }).cause;
	}
}

/** True when the error (or one it wraps) says PostgreSQL cannot be reached or went away. */
export function isDatabaseUnavailable(error: unknown): boolean {
	for (const e of causes(error)) {
		if (typeof e !== 'object' || e === null) continue;
		const code = (e as { code?: unknown }).code;
		if (typeof code === 'string') {
			if (UNAVAILABLE_CODES.has(code) || code.startsWith('08')) return true;
			if (UNAVAILABLE_NODE_CODES.has(code)) return true;
		}
		const message = (e as { message?: unknown }).message;
		if (typeof message === 'string' && UNAVAILABLE_MESSAGES.some((m) => message.includes(m))) {
			return true;
		}
	}
	return false;
}

/**
 * A loggable description of a failed query: its name (statement and first table, e.g.
 * `select "clients"`) and SQLSTATE. Never the SQL parameters, nor PostgreSQL's own message,
 * which may quote a value ("invalid input syntax for type …: "Hana"").
 */
export function describeQueryFailure(error: unknown): string | null {
	for (const e of causes(error)) {
		if (typeof e !== 'object' || e === null) continue;
		const query = (e as { query?: unknown }).query;
		if (typeof query !== 'string') continue;
		const inner = (e as { cause?: { code?: unknown } }).cause;
		const code = typeof inner?.code === 'string' ? inner.code : 'unknown';
		return `query ${queryName(query)} failed (code ${code})`;
	}
	return null;
}

/** `select "clients"`, `insert "outbox"`, `update "outbox"` …: what a query did, to what. */
export function queryName(query: string): string {
	const verb = /^\s*(with|select|insert|update|delete|begin|commit|rollback)\b/i.exec(query);
	const table = /\b(?:from|into|update)\s+("[^"]+"|[a-z_][a-z0-9_]*)/i.exec(query);
	return [verb?.[1]?.toLowerCase() ?? 'statement', table?.[1]].filter(Boolean).join(' ');
}

/**
 * What the server log may say about an unexpected error: a failed query by name and code,
 * anything else by its class and message (first line, no stack of wrapped SQL).
 */
export function describeError(error: unknown): string {
	const query = describeQueryFailure(error);
	if (query) return query;
	if (error instanceof Error) {
		return `${error.name}: ${error.message.split('\n')[0]!.slice(0, 300)}\n${error.stack?.split('\n').slice(1, 8).join('\n') ?? ''}`;
	}
	return String(error).slice(0, 300);
}

/** One line for a background worker's log: a failed query by name, else the first line. */
export function briefError(error: unknown): string {
	const query = describeQueryFailure(error);
	const unavailable = isDatabaseUnavailable(error) ? ' (database unavailable)' : '';
	if (query) return query + unavailable;
	const message = error instanceof Error ? error.message : String(error);
	return message.split('\n')[0]!.slice(0, 300);
}
