// For `npm run bench`: seals the whole access log (as the app's sealer would, but all at once
// before the app starts, so sealing does not run under the measured load), then walks the
// chain and prints one JSON line: rows sealed, sealing time, and the verify walk's rows/s.
import { sealPending } from '../src/lib/server/audit/sealer';
import { verifyChain } from '../src/lib/server/audit/verify';
import { createDatabase } from '../src/lib/server/db';

const database = createDatabase(process.env.DATABASE_URL!, { max: 2 });
try {
	const started = performance.now();
	let sealed = 0;
	for (;;) {
		const result = await sealPending(database, { gapGraceMs: 0, batchSize: 5000 });
		sealed += result.sealed;
		if (result.sealed === 0) break;
	}
	const sealMs = performance.now() - started;
	const report = await verifyChain(database, { batchSize: 5000 });
	console.log(
		JSON.stringify({
			sealed,
			sealMs: Math.round(sealMs),
			intact: report.intact,
			rows: report.rows,
			verifyRowsPerSecond: Math.round(report.rowsPerSecond)
		})
	);
} finally {
	await database.$client.end();
}
