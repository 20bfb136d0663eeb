// qpdf (Debian's package) reads uploaded PDFs for the safety check and rewrites downloads
// (src/lib/server/documents/qpdf.ts). Installed here when missing, like PostgreSQL.
import { existsSync } from 'node:fs';
import { aptInstall } from './postgres.mjs';

export function ensureQpdfInstalled(log = console.log) {
	if (existsSync('/usr/bin/qpdf')) return;
	if (process.getuid?.() !== 0) {
		throw new Error(
			'qpdf is missing (it checks uploaded PDFs). Install it once, then run this again:\n' +
				'  sudo apt-get update && sudo DEBIAN_FRONTEND=noninteractive apt-get install -y qpdf'
		);
	}
	log('Installing qpdf from Debian packages (apt-get install -y qpdf) …');
	aptInstall(['qpdf']);
}
