// PostgreSQL from Debian's packages, run by our own scripts in a folder of ours on
// 127.0.0.1 — never the system-wide cluster. As root, initdb and pg_ctl run as the
// unprivileged `postgres` OS user (initdb refuses to run as root).
import { spawnSync } from 'node:child_process';
import {
	chmodSync,
	chownSync,
	existsSync,
	mkdirSync,
	readdirSync,
	rmSync,
	writeFileSync
} from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';

const isRoot = process.getuid?.() === 0;

function run(cmd, args, { asPostgres = false, allowFail = false } = {}) {
	const full =
		asPostgres && isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
	const result = spawnSync(full[0], full[1], { encoding: 'utf8' });
	if (result.status !== 0 && !allowFail) {
		throw new Error(`${cmd} ${args.join(' ')} failed:\n${result.stderr || result.stdout}`);
	}
	return result;
}

function findBinDir() {
	const base = '/usr/lib/postgresql';
	if (!existsSync(base)) return null;
	const versions = readdirSync(base)
		.filter((v) => existsSync(join(base, v, 'bin', 'initdb')))
		.sort((a, b) => Number(b) - Number(a));
	return versions.length ? join(base, versions[0], 'bin') : null;
}

/** Finds Debian's PostgreSQL binaries, installing the package first when we may. */
export function ensurePostgresInstalled(log = console.log) {
	let bin = findBinDir();
	if (bin) return bin;
	if (!isRoot) {
		throw new Error(
			'PostgreSQL server binaries are missing. Install them once, then run this again:\n' +
				'  sudo apt-get update && sudo DEBIAN_FRONTEND=noninteractive apt-get install -y postgresql'
		);
	}
	log('Installing PostgreSQL from Debian packages (apt-get install -y postgresql) …');
	aptInstall(['postgresql']);
	bin = findBinDir();
	if (!bin)
		throw new Error(
			'apt-get installed postgresql but no initdb was found under /usr/lib/postgresql'
		);
	return bin;
}

export function aptInstall(packages) {
	const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
	for (const args of [
		['update', '-qq'],
		['install', '-y', '-qq', ...packages]
	]) {
		const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
		if (r.status !== 0) throw new Error(`apt-get ${args.join(' ')} failed (exit ${r.status})`);
	}
}

/** True when the `postgres` OS user can reach the folder (every parent must be traversable). */
function reachableByPostgres(dir) {
	if (!isRoot) return true;
	return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]).status === 0;
}

/**
 * Initialises the cluster when the folder is new, starts it when it is not running, and
 * returns a handle to stop it. `throwaway` turns durability off (tests only).
 */
export function startPostgres({
	bin,
	dataDir,
	port,
	superPassword,
	throwaway = false,
	log = console.log
}) {
	const parent = join(dataDir, '..');
	mkdirSync(parent, { recursive: true });
	if (!reachableByPostgres(parent)) {
		throw new Error(
			`The folder ${parent} is not reachable by the 'postgres' OS user (a parent folder is private).\n` +
				'Set PGDATA_DIR to a folder under a traversable path, e.g. PGDATA_DIR=/var/tmp/seamwell-pg'
		);
	}
	if (!existsSync(join(dataDir, 'PG_VERSION'))) initCluster({ bin, dataDir, superPassword, log });

	const status = run(join(bin, 'pg_ctl'), ['status', '-D', dataDir], {
		asPostgres: true,
		allowFail: true
	});
	if (status.status !== 0) {
		const options = [
			'-c listen_addresses=127.0.0.1',
			`-p ${port}`,
			`-k ${dataDir}`,
			...(throwaway ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : [])
		].join(' ');
		run(
			join(bin, 'pg_ctl'),
			['start', '-w', '-t', '60', '-D', dataDir, '-l', join(dataDir, 'server.log'), '-o', options],
			{
				asPostgres: true
			}
		);
	}
	return {
		stop() {
			stopPostgres({ bin, dataDir });
		}
	};
}

/**
 * Stops the cluster the fast way (open connections are ended, as in a real restart); waits
 * until it is down.
 */
export function stopPostgres({ bin, dataDir }) {
	run(join(bin, 'pg_ctl'), ['stop', '-m', 'fast', '-w', '-D', dataDir], {
		asPostgres: true,
		allowFail: true
	});
}

function initCluster({ bin, dataDir, superPassword, log }) {
	log(`Creating a PostgreSQL cluster in ${dataDir} …`);
	rmSync(dataDir, { recursive: true, force: true });
	mkdirSync(dataDir, { recursive: true });
	const pwfile = join(dataDir, '..', `.pwfile-${process.pid}`);
	writeFileSync(pwfile, superPassword + '\n', { mode: 0o600 });
	if (isRoot) {
		const ids = spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).stdout.trim();
		const gid = spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).stdout.trim();
		chownSync(dataDir, Number(ids), Number(gid));
		chownSync(pwfile, Number(ids), Number(gid));
	}
	chmodSync(dataDir, 0o700);
	try {
		run(
			join(bin, 'initdb'),
			[
				'-D',
				dataDir,
				'-U',
				'postgres',
				'--pwfile',
				pwfile,
				'--auth=scram-sha-256',
				'-E',
				'UTF8',
				'--locale=C.UTF-8'
			],
			{ asPostgres: true }
		);
	} finally {
		rmSync(pwfile, { force: true });
	}
}

/** Creates (or updates the passwords of) the owner and app roles, and the database. */
export async function ensureDatabase(env) {
	const client = new pg.Client({ connectionString: env.DATABASE_SUPERUSER_URL });
	await client.connect();
	try {
		for (const [user, password] of [
			[env.DB_OWNER_USER, env.DB_OWNER_PASSWORD],
			[env.DB_APP_USER, env.DB_APP_PASSWORD]
		]) {
			const exists = await client.query('SELECT 1 FROM pg_roles WHERE rolname = $1', [user]);
			const verb = exists.rowCount ? 'ALTER' : 'CREATE';
			await client.query(`${verb} ROLE ${ident(user)} LOGIN PASSWORD ${literal(password)}`);
		}
		const db = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [env.DB_NAME]);
		if (!db.rowCount) {
			await client.query(`CREATE DATABASE ${ident(env.DB_NAME)} OWNER ${ident(env.DB_OWNER_USER)}`);
		}
	} finally {
		await client.end();
	}
}

const ident = (name) => {
	if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`Unsafe database identifier: ${name}`);
	return `"${name}"`;
};
const literal = (value) => `'${String(value).replaceAll("'", "''")}'`;

/** True when the cluster answers at the env's address (for scripts that leave it as found). */
export async function isDatabaseUp(env) {
	const client = new pg.Client({ connectionString: env.DATABASE_SUPERUSER_URL });
	try {
		await client.connect();
		await client.end();
		return true;
	} catch {
		return false;
	}
}
