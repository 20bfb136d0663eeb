// A throwaway environment for test and benchmark runs: fresh secrets, its own ports (so it
// can run beside `npm start`), URLs derived from those ports and never taken from the
// caller's environment, and a scratch folder removed afterwards.
import { randomBytes } from 'node:crypto';
import { chmodSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { defaults, derivedKeys, withDerived } from './env.mjs';

const secret = () => randomBytes(24).toString('base64url');

/**
 * @param {{ prefix: string, ports: { PORT: string, PGPORT: string, S3_PORT: string, MAIL_SMTP_PORT: string, MAIL_HTTP_PORT: string } }} options
 */
export function throwawayEnv({ prefix, ports }) {
	const scratch = mkdtempSync(join(tmpdir(), `seamwell-${prefix}-`));
	// The `postgres` OS user runs the cluster (as root) and must be able to enter the folder.
	chmodSync(scratch, 0o711);
	/** @type {Record<string, string | undefined>} */
	const base = {
		...defaults,
		...process.env,
		NODE_ENV: 'test',
		...ports,
		AUTH_SECRET: secret(),
		DB_SUPERUSER_PASSWORD: secret(),
		DB_OWNER_PASSWORD: secret(),
		DB_APP_PASSWORD: secret()
	};
	for (const key of derivedKeys) delete base[key];
	return { env: withDerived(base), scratch };
}
