// Types for postgres.mjs, for the TypeScript tests that stop and start the test cluster.

type Log = (line: string) => void;

export function ensurePostgresInstalled(log?: Log): string;
export function aptInstall(packages: string[]): void;
export function startPostgres(options: {
	bin: string;
	dataDir: string;
	port: string | number;
	/** Needed only when the cluster is created. */
	superPassword?: string;
	throwaway?: boolean;
	log?: Log;
}): { stop(): void };
export function stopPostgres(options: { bin: string; dataDir: string }): void;
export function ensureDatabase(env: Record<string, string>): Promise<void>;
