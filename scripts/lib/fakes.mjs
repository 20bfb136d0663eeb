// Starts the S3 fake and the mail fake from fakes/ as child processes and waits until
// each answers on loopback.
import { spawn } from 'node:child_process';
import { join } from 'node:path';
import { root } from './env.mjs';

export async function startFakes(env, { s3Dir, mailStore, log = console.log } = {}) {
	const children = [];
	const s3 = spawn(process.execPath, [join(root, 'fakes', 's3.mjs')], {
		env: {
			...env,
			S3_PORT: env.S3_PORT,
			S3_DIR: s3Dir,
			S3_BUCKET: env.S3_BUCKET,
			AUDIT_ANCHOR_BUCKET: env.AUDIT_ANCHOR_BUCKET
		},
		stdio: ['ignore', 'inherit', 'inherit']
	});
	children.push(s3);
	const mail = spawn(process.execPath, [join(root, 'fakes', 'mail.mjs')], {
		env: {
			...env,
			MAIL_SMTP_PORT: env.MAIL_SMTP_PORT,
			MAIL_HTTP_PORT: env.MAIL_HTTP_PORT,
			...(mailStore ? { MAIL_STORE: mailStore } : {})
		},
		stdio: ['ignore', 'inherit', 'inherit']
	});
	children.push(mail);
	await Promise.all([
		waitForHttp(`${env.S3_ENDPOINT}/`, 's3 fake', s3),
		waitForHttp(`${env.MAIL_INBOX_URL}/healthz`, 'mail fake', mail)
	]);
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
