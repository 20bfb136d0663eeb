import { z } from 'zod';

// Server configuration, read from the environment once and checked: a missing or malformed
// variable stops start-up with a message naming it. Read from process.env (not
// $env/dynamic/private) because the CLI scripts (demo data, audit verification) share
// these modules outside SvelteKit.

const schema = z.object({
	DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/ }),
	AUTH_SECRET: z.string().min(32, 'must be at least 32 characters'),
	ORIGIN: z.url(),
	S3_ENDPOINT: z.url(),
	S3_BUCKET: z.string().min(1),
	/** A separate bucket for the access log's anchored heads (object lock in production). */
	AUDIT_ANCHOR_BUCKET: z.string().min(1),
	S3_REGION: z.string().default('us-east-1'),
	S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
	S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
	SMTP_HOST: z.string().min(1),
	SMTP_PORT: z.coerce.number().int().positive(),
	MAIL_FROM: z.string().min(3).default('Seamwell <no-reply@seamwell.example>'),
	// Sign-in requests allowed in any 15 minutes, per e-mail address and per client address.
	RATE_LIMIT_SIGNIN_PER_EMAIL: z.coerce.number().int().positive().default(5),
	RATE_LIMIT_SIGNIN_PER_IP: z.coerce.number().int().positive().default(30),
	/** `1` only when `npm run bench` starts the app: opens the benchmark's baseline route. */
	SEAMWELL_BENCH: z.enum(['0', '1'], 'must be 0 or 1').default('0')
});

export type Config = z.infer<typeof schema>;

let cached: Config | undefined;

export function config(): Config {
	cached ??= parseConfig(process.env);
	return cached;
}

/** Checks an environment; throws a message naming every missing or malformed variable. */
export function parseConfig(env: Record<string, string | undefined>): Config {
	const parsed = schema.safeParse(env);
	if (!parsed.success) {
		const problems = parsed.error.issues
			.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`)
			.join('\n');
		throw new Error(
			`Seamwell's configuration is incomplete. Set these environment variables (see .env.example):\n${problems}`
		);
	}
	return parsed.data;
}
