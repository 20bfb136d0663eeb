import { and, count, eq, lt, sql } from 'drizzle-orm';
import { config } from '../config';
import { db } from '../db';
import { rateLimitHits } from '../db/schema';

// Sign-in requests are counted in PostgreSQL, so every app process shares one count.
// Defaults: 5 requests per address and 30 per client address in any 15 minutes; override
// with RATE_LIMIT_SIGNIN_PER_EMAIL and RATE_LIMIT_SIGNIN_PER_IP.

export const RATE_WINDOW_MINUTES = 15;

export interface SignInLimits {
	perEmail: number;
	perAddress: number;
}

/** The limits from the checked configuration (config.ts). */
export function signInLimits(): SignInLimits {
	const settings = config();
	return {
		perEmail: settings.RATE_LIMIT_SIGNIN_PER_EMAIL,
		perAddress: settings.RATE_LIMIT_SIGNIN_PER_IP
	};
}

export type Allowance =
	{ allowed: true } | { allowed: false; bucket: 'signin.email' | 'signin.ip' };

/**
 * Counts one sign-in request against both limits, or refuses it without counting (so a
 * flood does not push the window forward). Advisory locks make concurrent requests for
 * the same key wait for each other, across processes.
 */
export async function consumeSignInAllowance(
	email: string,
	address: string | null,
	limits: SignInLimits = signInLimits()
): Promise<Allowance> {
	const buckets = [
		{ bucket: 'signin.email' as const, key: email, limit: limits.perEmail },
		{ bucket: 'signin.ip' as const, key: address ?? 'unknown', limit: limits.perAddress }
	];
	return db().transaction(async (tx) => {
		for (const b of buckets) {
			await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${b.bucket + ':' + b.key}))`);
		}
		const since = sql`now() - make_interval(mins => ${RATE_WINDOW_MINUTES})`;
		for (const b of buckets) {
			await tx
				.delete(rateLimitHits)
				.where(
					and(
						eq(rateLimitHits.bucket, b.bucket),
						eq(rateLimitHits.key, b.key),
						lt(rateLimitHits.at, since)
					)
				);
			const [row] = await tx
				.select({ n: count() })
				.from(rateLimitHits)
				.where(and(eq(rateLimitHits.bucket, b.bucket), eq(rateLimitHits.key, b.key)));
			if ((row?.n ?? 0) >= b.limit) return { allowed: false, bucket: b.bucket };
		}
		await tx.insert(rateLimitHits).values(buckets.map((b) => ({ bucket: b.bucket, key: b.key })));
		return { allowed: true };
	});
}
