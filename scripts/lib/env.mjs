// Configuration for the scripts: defaults, the git-ignored .env (created with generated
// secrets on first start), and the URLs derived from ports. Real environment variables win.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { parseEnv } from 'node:util';
import { dirname, resolve } from 'node:path';

/**
 * V8 flags for the app's process. A larger young generation lets the short-lived objects of a
 * streamed export or a busy list die young instead of piling up in the old generation until
 * a full collection: the 1 M-row CSV export peaked at ~205 MB resident with the default
 * (live heap ~28 MB) and ~160 MB with this (`npm run bench`). Deployments should start
 * `node build` with the same flags.
 */
export const APP_NODE_FLAGS = ['--max-semi-space-size=32'];

export const root = resolve(import.meta.dirname, '..', '..');

export const defaults = {
	HOST: '127.0.0.1',
	PORT: '3000',
	PGPORT: '54329',
	S3_PORT: '4569',
	S3_BUCKET: 'seamwell',
	AUDIT_ANCHOR_BUCKET: 'seamwell-anchors',
	MAIL_SMTP_PORT: '1025',
	MAIL_HTTP_PORT: '1080',
	DB_NAME: 'seamwell',
	DB_OWNER_USER: 'seamwell_owner',
	DB_APP_USER: 'seamwell_app',
	// We pin an SDK release that supports Node 20; its notice about later releases is noise.
	AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true'
};

const secret = () => randomBytes(24).toString('base64url');

/** Creates .env with fresh secrets when there is none; never overwrites an existing one. */
export function ensureEnvFile(file = resolve(root, '.env')) {
	if (existsSync(file)) return false;
	const lines = [
		'# Written by `npm start` on first run. Git-ignored: keep it out of version control.',
		`AUTH_SECRET=${randomBytes(32).toString('base64url')}`,
		`DB_SUPERUSER_PASSWORD=${secret()}`,
		`DB_OWNER_PASSWORD=${secret()}`,
		`DB_APP_PASSWORD=${secret()}`,
		''
	];
	writeFileSync(file, lines.join('\n'), { mode: 0o600 });
	return true;
}

/** Where `npm start` records the ports and folders it runs with, for the other scripts. */
export const STACK_FILE = resolve(root, '.data', 'stack.json');

/** What `npm start` records: whatever says where its services listen and keep their data. */
export const STACK_KEYS = [
	'HOST',
	'PORT',
	'PGPORT',
	'S3_PORT',
	'MAIL_SMTP_PORT',
	'MAIL_HTTP_PORT',
	'PGDATA_DIR',
	'DB_NAME'
];

/**
 * Records the settings `npm start` runs with (ports given in the environment included), so that
 * `npm run audit:verify` and `npm run demo:reset` reach the same services.
 * @param {Record<string, string | undefined>} env
 */
export function recordStackSettings(env, file = STACK_FILE) {
	/** @type {Record<string, string>} */
	const settings = {};
	for (const key of STACK_KEYS) if (env[key] !== undefined) settings[key] = String(env[key]);
	mkdirSync(dirname(file), { recursive: true });
	writeFileSync(file, JSON.stringify(settings, null, 2) + '\n');
}

/** @returns {Record<string, string>} */
function readStackSettings(file = STACK_FILE) {
	if (!existsSync(file)) return {};
	try {
		const parsed = JSON.parse(readFileSync(file, 'utf8'));
		/** @type {Record<string, string>} */
		const out = {};
		for (const key of STACK_KEYS) if (typeof parsed[key] === 'string') out[key] = parsed[key];
		return out;
	} catch {
		return {};
	}
}

/**
 * Reads .env (if present) under the real environment, then fills defaults and derived URLs.
 * `stack: true` (the scripts that work on a running `npm start`) also reads the settings
 * `npm start` recorded, between .env and the real environment.
 */
export function loadEnv({
	file = resolve(root, '.env'),
	overrides = {},
	stack = false,
	stackFile = STACK_FILE
} = {}) {
	const fromFile = existsSync(file) ? parseEnv(readFileSync(file, 'utf8')) : {};
	const fromStack = stack ? readStackSettings(stackFile) : {};
	const env = {
		...defaults,
		...fromFile,
		...fromStack,
		...pickDefined(process.env),
		...overrides
	};
	return withDerived(env);
}

export const derivedKeys = [
	'DATABASE_SUPERUSER_URL',
	'DATABASE_OWNER_URL',
	'DATABASE_URL',
	'S3_ENDPOINT',
	'SMTP_HOST',
	'SMTP_PORT',
	'MAIL_INBOX_URL',
	'ORIGIN'
];

/**
 * @param {Record<string, string | undefined>} env
 * @returns {Record<string, string>}
 */
export function withDerived(env) {
	const host = env.HOST;
	/** @type {(user: string | undefined, password: string | undefined, db: string | undefined) => string} */
	const pg = (user, password, db) =>
		`postgres://${user}:${encodeURIComponent(password ?? '')}@127.0.0.1:${env.PGPORT}/${db}`;
	const derived = {
		DATABASE_SUPERUSER_URL: pg('postgres', env.DB_SUPERUSER_PASSWORD ?? '', 'postgres'),
		DATABASE_OWNER_URL: pg(env.DB_OWNER_USER, env.DB_OWNER_PASSWORD ?? '', env.DB_NAME),
		DATABASE_URL: pg(env.DB_APP_USER, env.DB_APP_PASSWORD ?? '', env.DB_NAME),
		S3_ENDPOINT: `http://127.0.0.1:${env.S3_PORT}`,
		SMTP_HOST: '127.0.0.1',
		SMTP_PORT: env.MAIL_SMTP_PORT,
		MAIL_INBOX_URL: `http://127.0.0.1:${env.MAIL_HTTP_PORT}`,
		MAIL_FROM: 'Seamwell <no-reply@seamwell.example>',
		ORIGIN: `http://${host}:${env.PORT}`,
		// Uploads of assessment PDFs need more than adapter-node's 512 kB default; other
		// routes are capped much lower in hooks.server.ts.
		BODY_SIZE_LIMIT: String(21 * 1024 * 1024)
	};
	// An explicitly set value (environment or .env) beats a derived one.
	return /** @type {Record<string, string>} */ ({ ...derived, ...env });
}

/** @param {Record<string, string | undefined>} source */
function pickDefined(source) {
	/** @type {Record<string, string>} */
	const out = {};
	for (const [key, value] of Object.entries(source)) if (value !== undefined) out[key] = value;
	return out;
}
