// Local S3 fake: s3rver on loopback with our bucket created up front, objects
// kept as files under `directory`. Development and tests only: s3rver does not
// enforce any access control.
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import S3rver from 's3rver';

/**
 * Starts s3rver with `bucket` created. Port may be 0 (any free port); the port
 * actually bound is returned. close() resolves once the listener is shut.
 */
export async function startS3Fake({
	port = 4569,
	host = '127.0.0.1',
	directory,
	bucket = 'seamwell',
	extraBuckets = []
} = {}) {
	if (!directory) throw new Error('s3 fake: directory is required');
	const s3rver = new S3rver({
		directory: path.resolve(directory),
		silent: true,
		configureBuckets: [bucket, ...extraBuckets].map((name) => ({ name }))
	});
	await s3rver.configureBuckets();
	// our own listener, not s3rver.run(): run() leaves a listen error such as
	// EADDRINUSE unhandled, which kills the whole process instead of rejecting
	const server = http.createServer(s3rver.callback());
	const boundPort = await listen(server, port, host);

	let closing;
	return {
		port: boundPort,
		close() {
			closing ??= closeServer(server, s3rver);
			return closing;
		}
	};
}

function listen(server, port, host) {
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, host, () => {
			server.off('error', reject);
			resolve(server.address().port);
		});
	});
}

function closeServer(server, s3rver) {
	return new Promise((resolve, reject) => {
		server.close((error) => {
			s3rver.logger.close();
			if (error) reject(error);
			else resolve();
		});
	});
}

function isMain() {
	return (
		Boolean(process.argv[1]) &&
		import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href
	);
}

function portFromEnv(name, fallback) {
	const raw = process.env[name];
	if (raw === undefined || raw === '') return fallback;
	const port = Number(raw);
	if (!Number.isInteger(port) || port < 0 || port > 65535) {
		throw new Error(`s3 fake: ${name} must be a port number, got "${raw}"`);
	}
	return port;
}

async function main() {
	const host = process.env.S3_HOST || '127.0.0.1';
	const bucket = process.env.S3_BUCKET || 'seamwell';
	// The access log's anchors live in a bucket of their own.
	const anchors = process.env.AUDIT_ANCHOR_BUCKET || 'seamwell-anchors';
	const directory = path.resolve(process.env.S3_DIR || '.data/s3');
	const fake = await startS3Fake({
		port: portFromEnv('S3_PORT', 4569),
		host,
		directory,
		bucket,
		extraBuckets: [anchors]
	});
	const shown = host.includes(':') ? `[${host}]` : host;
	console.log(
		`s3 fake: http://${shown}:${fake.port} buckets ${bucket}, ${anchors}, files in ${directory}`
	);

	const stop = (signal) => {
		// a second signal means "now"
		process.once(signal, () => process.exit(1));
		fake.close().then(
			() => process.exit(0),
			(error) => {
				console.error(error);
				process.exit(1);
			}
		);
	};
	process.once('SIGINT', stop);
	process.once('SIGTERM', stop);
}

if (isMain()) {
	main().catch((error) => {
		console.error(error.message ?? error);
		process.exit(1);
	});
}
