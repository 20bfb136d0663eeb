// Starts the S3 fake and the mail fake from fakes/ as child processes and waits until
// each answers on loopback.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { root } from './env.mjs';

/** Starts the S3 fake as a child process (not waiting for it). */
export function spawnS3Fake(env, { s3Dir }) {
	return spawn(process.execPath, [join(root, 'fakes', 's3.mjs')], {
		env: {
			...env,
			S3_PORT: env.S3_PORT,
			S3_DIR: s3Dir,
			S3_BUCKET: env.S3_BUCKET,
			AUDIT_ANCHOR_BUCKET: env.AUDIT_ANCHOR_BUCKET
		},
		stdio: ['ignore', 'inherit', 'inherit']
	});
}

/** Starts the mail fake as a child process (not waiting for it). */
export function spawnMailFake(env, { mailStore } = {}) {
	return spawn(process.execPath, [join(root, 'fakes', 'mail.mjs')], {
		env: {
			...env,
			MAIL_SMTP_PORT: env.MAIL_SMTP_PORT,
			MAIL_HTTP_PORT: env.MAIL_HTTP_PORT,
			...(mailStore ? { MAIL_STORE: mailStore } : {})
		},
		stdio: ['ignore', 'inherit', 'inherit']
	});
}

export const s3Ready = (env, child) => waitForHttp(`${env.S3_ENDPOINT}/`, 's3 fake', child);
export const mailReady = (env, child) =>
	waitForHttp(`${env.MAIL_INBOX_URL}/healthz`, 'mail fake', child);

export async function startFakes(env, { s3Dir, mailStore, log = console.log } = {}) {
	const s3 = spawnS3Fake(env, { s3Dir });
	const mail = spawnMailFake(env, { mailStore });
	const children = [s3, mail];
	await Promise.all([s3Ready(env, s3), mailReady(env, mail)]);
	log(`S3 fake   ${env.S3_ENDPOINT} (buckets ${env.S3_BUCKET}, ${env.AUDIT_ANCHOR_BUCKET})`);
	log(`Mail fake smtp://127.0.0.1:${env.MAIL_SMTP_PORT}, inbox ${env.MAIL_INBOX_URL}`);
	return {
		children,
		stop: () => Promise.all(children.map(stopChild))
	};
}

export async function waitForHttp(url, name, child, timeoutMs = 30_000) {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		if (child && child.exitCode !== null)
			throw new Error(`${name} exited with code ${child.exitCode}`);
		try {
			const res = await fetch(url, { signal: AbortSignal.timeout(1000) });
			await res.arrayBuffer();
			return;
		} catch {
			await new Promise((r) => setTimeout(r, 150));
		}
	}
	throw new Error(`${name} did not answer at ${url} within ${timeoutMs / 1000} s`);
}

export function stopChild(child) {
	return new Promise((resolve) => {
		if (!child || child.exitCode !== null || child.signalCode) return resolve();
		const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
		child.once('exit', () => {
			clearTimeout(timer);
			resolve();
		});
		child.kill('SIGTERM');
	});
}
