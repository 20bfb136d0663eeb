import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// The one door to qpdf (Debian's `qpdf` package, installed by `npm start` and `npm test`), the
// PDF parser behind the upload check and the download's content disarm. qpdf reads the whole
// file as a reader would — cross-reference streams, object streams, every standard filter and
// predictor — and says when it had to guess (exit status 3) or gave up (2).
//
// Each run gets the file in a private temporary folder (qpdf needs to seek, so no pipe), a
// memory ceiling (prlimit's address-space limit: a zip bomb inside an object stream must be
// held whole) and a time limit; hitting either counts as "could not read".

export interface QpdfLimits {
	/** Address space for one qpdf process, in bytes. */
	maxMemory: number;
	/** Wall-clock time for one qpdf process, in milliseconds. */
	timeoutMs: number;
}

export const DEFAULT_QPDF_LIMITS: QpdfLimits = { maxMemory: 512 * 1024 * 1024, timeoutMs: 30_000 };

/** JSON output larger than this is not from a 20 MB document; treat it as unreadable. */
const MAX_JSON_BYTES = 256 * 1024 * 1024;

export interface QpdfRun {
	/** 0: read cleanly; 2: errors; 3: warnings (qpdf repaired or skipped something). */
	status: number;
	stdout: string;
	stderr: string;
}

/** Thrown when qpdf itself is missing: a setup fault, never the uploader's. */
export class QpdfMissingError extends Error {
	constructor() {
		super(
			'qpdf is not installed; `npm start` installs it, or run: apt-get install -y qpdf (Debian)'
		);
	}
}

function run(args: string[], limits: QpdfLimits): Promise<QpdfRun> {
	return new Promise((resolve, reject) => {
		execFile(
			'prlimit',
			[`--as=${limits.maxMemory}`, '--', 'qpdf', ...args],
			{ timeout: limits.timeoutMs, maxBuffer: MAX_JSON_BYTES, encoding: 'utf8' },
			(error, stdout, stderr) => {
				if (error === null) return resolve({ status: 0, stdout, stderr });
				// No prlimit to start (ENOENT), or prlimit found no qpdf (127): a setup fault.
				if (error.code === 'ENOENT' || error.code === 127) return reject(new QpdfMissingError());
				// Killed for time, out of memory (a signal or std::bad_alloc) or too much output.
				const status = typeof error.code === 'number' ? error.code : 2;
				resolve({ status: status === 3 ? 3 : Math.max(status, 2), stdout, stderr });
			}
		);
	});
}

/** Runs `work` with the bytes in a private temporary file; removes the folder afterwards. */
async function withFile<T>(bytes: Uint8Array, work: (path: string, dir: string) => Promise<T>) {
	const dir = await mkdtemp(join(tmpdir(), 'seamwell-qpdf-'));
	try {
		const path = join(dir, 'in.pdf');
		await writeFile(path, bytes, { mode: 0o600 });
		return await work(path, dir);
	} finally {
		await rm(dir, { recursive: true, force: true });
	}
}

/** A PDF object in qpdf's JSON v2 form: names `/X`, strings `u:…` or `b:…`, references `n g R`. */
export type QpdfValue =
	null | boolean | number | string | QpdfValue[] | { [key: string]: QpdfValue };

export interface QpdfObject {
	value?: QpdfValue;
	stream?: { dict: { [key: string]: QpdfValue } };
}

export interface QpdfJson {
	pages: Array<{ object: string }>;
	encrypt: { encrypted: boolean };
	qpdf: [unknown, Record<string, QpdfObject>];
}

export type QpdfRead =
	{ kind: 'read'; json: QpdfJson } | { kind: 'encrypted' } | { kind: 'unreadable'; detail: string };

/**
 * Reads every object of the file (stream contents aside) as JSON, then decodes every stream
 * a reader would use (`--check`). Any warning or error makes the file unreadable.
 */
export function readPdf(bytes: Uint8Array, limits: QpdfLimits = DEFAULT_QPDF_LIMITS) {
	return withFile(bytes, async (path): Promise<QpdfRead> => {
		const json = await run(
			[
				'--json=2',
				'--json-key=pages',
				'--json-key=encrypt',
				'--json-key=qpdf',
				'--json-stream-data=none',
				path,
				'-'
			],
			limits
		);
		if (json.status !== 0) {
			// An encrypted file without an empty user password fails to open; ask directly.
			const encrypted = await run(['--is-encrypted', path], limits);
			if (encrypted.status === 0) return { kind: 'encrypted' };
			return { kind: 'unreadable', detail: json.stderr.slice(0, 500) };
		}
		let parsed: QpdfJson;
		try {
			parsed = JSON.parse(json.stdout) as QpdfJson;
		} catch {
			return { kind: 'unreadable', detail: 'qpdf printed JSON that does not parse' };
		}
		if (parsed.encrypt.encrypted) return { kind: 'encrypted' };
		const check = await run(['--check', path], limits);
		if (check.status !== 0) {
			return { kind: 'unreadable', detail: (check.stderr || check.stdout).slice(0, 500) };
		}
		return { kind: 'read', json: parsed };
	});
}

/**
 * The same document written plainly: a classic cross-reference table, no object streams, only
 * the objects reachable from the trailer; stream data copied as it is (never inflated here).
 * pdf-lib reads such a file completely, which it cannot promise for everything a writer makes.
 */
export function rewritePlain(
	bytes: Uint8Array,
	limits: QpdfLimits = DEFAULT_QPDF_LIMITS
): Promise<Uint8Array> {
	return withFile(bytes, async (path, dir) => {
		const out = join(dir, 'plain.pdf');
		const result = await run(
			['--object-streams=disable', '--stream-data=preserve', '--deterministic-id', path, out],
			limits
		);
		if (result.status !== 0) {
			throw new Error(`qpdf could not rewrite the PDF (status ${result.status})`);
		}
		return new Uint8Array(await readFile(out));
	});
}
