// Walks the access log's hash chain and reports: intact, or the first broken or missing
// link, and rows left unsealed for more than a minute. Run through `npm run audit:verify`
// (scripts/audit-verify.mjs loads .env). Reads as the app's database role; `--seal` first
// seals what is pending (as the running app's sealer would). Checks every head anchored in
// the anchor bucket (AUDIT_ANCHOR_BUCKET) too, and anchors the current one.
// Exit code: 0 intact and nothing stale; 1 a broken or missing link; 2 only stale rows.
import { createDatabase } from '../src/lib/server/db';
import { sealPending } from '../src/lib/server/audit/sealer';
import { describeReport, verifyAnchored } from '../src/lib/server/audit/verify';
import { s3AnchorStore } from '../src/lib/server/storage/anchors';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('DATABASE_URL is not set: run `npm run audit:verify`.');
	process.exit(1);
}
const database = createDatabase(url, { max: 1 });
try {
	if (process.argv.includes('--seal')) {
		const sealed = await sealPending(database);
		console.log(
			sealed.locked ? `sealed ${sealed.sealed} row(s)` : 'another sealer is at work: not sealing'
		);
	}
	// Anchors the current head, then checks the chain and every head anchored in the bucket.
	const report = await verifyAnchored(database, s3AnchorStore);
	console.log(describeReport(report));
	process.exitCode = report.firstBroken ? 1 : report.ok ? 0 : 2;
} catch (error) {
	console.error(`audit:verify: ${error instanceof Error ? error.message : error}`);
	process.exitCode = 1;
} finally {
	await database.$client.end();
}
