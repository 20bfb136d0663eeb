// Local mail fake: an SMTP server that keeps every message, and a small HTTP
// inbox that tests and people read. Development and tests only: no TLS, no
// authentication check, every sender and recipient accepted.
import { randomUUID } from 'node:crypto';
import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

const PAGE_CSP = "default-src 'none'; style-src 'unsafe-inline'";

// ---------------------------------------------------------------- inbox store

// Loads the saved inbox; a missing file simply means an empty inbox.
async function loadMessages(storeFile) {
	if (!storeFile) return [];
	try {
		const saved = JSON.parse(await readFile(storeFile, 'utf8'));
		return Array.isArray(saved) ? saved : [];
	} catch (error) {
		if (error.code === 'ENOENT') return [];
		throw new Error(`mail fake: cannot read MAIL_STORE ${storeFile}: ${error.message}`, {
			cause: error
		});
	}
}

// Messages live in memory, oldest first; when a store file is given every
// change is written through, one write at a time, by rename so a crash never
// leaves half a file.
function createInbox(messages, storeFile) {
	let pending = Promise.resolve();

	function persist() {
		if (!storeFile) return Promise.resolve();
		const snapshot = JSON.stringify(messages, null, '\t');
		// an earlier failed write must not block the ones after it
		pending = pending
			.catch(() => {})
			.then(async () => {
				await mkdir(path.dirname(storeFile), { recursive: true });
				const temporary = `${storeFile}.${process.pid}.tmp`;
				await writeFile(temporary, snapshot);
				await rename(temporary, storeFile);
			});
		return pending;
	}

	return {
		add(message) {
			messages.push(message);
			return persist();
		},
		list(to) {
			const wanted = normaliseAddress(to);
			const matching = wanted ? messages.filter((m) => m.to.includes(wanted)) : messages;
			return [...matching].reverse();
		},
		get(id) {
			return messages.find((m) => m.id === id);
		},
		clear(to) {
			const wanted = normaliseAddress(to);
			const kept = wanted ? messages.filter((m) => !m.to.includes(wanted)) : [];
			messages.splice(0, messages.length, ...kept);
			return persist();
		},
		// failures were already answered to the SMTP client or HTTP caller
		flushed: () => pending.catch(() => {})
	};
}

function normaliseAddress(value) {
	return (value ?? '').trim().toLowerCase();
}

// ---------------------------------------------------------------- SMTP side

// Turns a parsed mail plus its envelope into the stored shape. Recipients come
// from RCPT TO (not the headers) so Bcc and envelope-only recipients are found.
function toStoredMessage(parsed, envelope) {
	const to = [...new Set(envelope.rcptTo.map((r) => normaliseAddress(r.address)))];
	return {
		id: randomUUID(),
		from: parsed.from?.text || envelope.mailFrom?.address || '',
		to,
		subject: parsed.subject ?? '',
		text: parsed.text ?? '',
		html: typeof parsed.html === 'string' ? parsed.html : null,
		date: new Date().toISOString(),
		attachments: (parsed.attachments ?? []).map((a) => ({
			filename: a.filename ?? null,
			contentType: a.contentType,
			size: a.size
		}))
	};
}

function createSmtpServer(inbox) {
	const server = new SMTPServer({
		authOptional: true,
		// accept AUTH in clear too, so an app configured with credentials still works
		allowInsecureAuth: true,
		disabledCommands: ['STARTTLS'],
		disableReverseLookup: true,
		size: MAX_MESSAGE_BYTES,
		closeTimeout: 1000,
		logger: false,
		onAuth(auth, session, callback) {
			callback(null, { user: auth.username || 'anyone' });
		},
		onData(stream, session, callback) {
			receive(stream, session, inbox).then(
				() => callback(),
				(error) => callback(error)
			);
		}
	});
	// a client dropping its connection must not bring the fake down
	server.on('error', (error) => {
		if (server.server.listening) console.error(`mail fake: smtp: ${error.message}`);
	});
	return server;
}

async function receive(stream, session, inbox) {
	const parsed = await simpleParser(stream);
	if (stream.sizeExceeded) {
		const error = new Error('Message exceeds the fixed maximum message size');
		error.responseCode = 552;
		throw error;
	}
	await inbox.add(toStoredMessage(parsed, session.envelope));
}

// Resolves with the bound port, rejects on e.g. EADDRINUSE.
function listenSmtp(server, port, host) {
	return new Promise((resolve, reject) => {
		const onError = (error) => reject(error);
		server.server.once('error', onError);
		server.listen(port, host, () => {
			server.server.off('error', onError);
			resolve(server.server.address().port);
		});
	});
}

function closeSmtp(server) {
	return new Promise((resolve) => {
		server.close(() => resolve());
	});
}

// ---------------------------------------------------------------- HTTP side

function sendJson(res, status, body, headers = {}) {
	res.writeHead(status, {
		'content-type': 'application/json; charset=utf-8',
		'cache-control': 'no-store',
		...headers
	});
	res.end(JSON.stringify(body));
}

function sendEmpty(res, status) {
	res.writeHead(status, { 'cache-control': 'no-store' });
	res.end();
}

function sendHtml(res, html) {
	res.writeHead(200, {
		'content-type': 'text/html; charset=utf-8',
		'cache-control': 'no-store',
		'content-security-policy': PAGE_CSP,
		'x-content-type-options': 'nosniff'
	});
	res.end(html);
}

function methodNotAllowed(res, allow) {
	sendJson(res, 405, { error: 'method not allowed' }, { allow });
}

function createHttpServer(inbox) {
	return http.createServer((req, res) => {
		try {
			handleRequest(inbox, req, res);
		} catch (error) {
			sendJson(res, 500, { error: error.message });
		}
	});
}

function handleRequest(inbox, req, res) {
	const url = new URL(req.url ?? '/', 'http://inbox.invalid');
	const to = url.searchParams.get('to');
	const pathname = url.pathname;

	if (pathname === '/healthz') {
		if (req.method !== 'GET') return methodNotAllowed(res, 'GET');
		return sendJson(res, 200, { ok: true });
	}
	if (pathname === '/') {
		if (req.method !== 'GET') return methodNotAllowed(res, 'GET');
		return sendHtml(res, renderPage(inbox.list(to), to));
	}
	if (pathname === '/api/messages') {
		if (req.method === 'GET') return sendJson(res, 200, inbox.list(to));
		if (req.method === 'DELETE') {
			return inbox.clear(to).then(
				() => sendEmpty(res, 204),
				(error) => sendJson(res, 500, { error: error.message })
			);
		}
		return methodNotAllowed(res, 'GET, DELETE');
	}
	const single = /^\/api\/messages\/([^/]+)$/.exec(pathname);
	if (single) {
		if (req.method !== 'GET') return methodNotAllowed(res, 'GET');
		// ids are UUIDs, so the raw path segment is compared as is
		const message = inbox.get(single[1]);
		if (message) return sendJson(res, 200, message);
		return sendJson(res, 404, { error: 'no such message' });
	}
	sendJson(res, 404, { error: 'not found' });
}

function listenHttp(server, port, host) {
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, host, () => {
			server.off('error', reject);
			resolve(server.address().port);
		});
	});
}

function closeHttp(server) {
	return new Promise((resolve) => {
		server.close(() => resolve());
	});
}

// ---------------------------------------------------------------- HTML page

function escapeHtml(value) {
	return String(value ?? '')
		.replaceAll('&', '&amp;')
		.replaceAll('<', '&lt;')
		.replaceAll('>', '&gt;')
		.replaceAll('"', '&quot;')
		.replaceAll("'", '&#39;');
}

// Escapes the whole text and turns http(s) links into anchors; only the
// matched URL becomes an href, and it is escaped too.
function linkify(text) {
	const urlPattern = /https?:\/\/[^\s<>"']+[^\s<>"'.,;:!?)\]]/g;
	let html = '';
	let last = 0;
	for (const match of text.matchAll(urlPattern)) {
		html += escapeHtml(text.slice(last, match.index));
		const url = escapeHtml(match[0]);
		html += `<a href="${url}">${url}</a>`;
		last = match.index + match[0].length;
	}
	return html + escapeHtml(text.slice(last));
}

function describeAttachment(attachment) {
	const name = escapeHtml(attachment.filename ?? 'unnamed');
	return `${name} (${escapeHtml(attachment.contentType)}, ${escapeHtml(attachment.size)} bytes)`;
}

function renderMessage(message) {
	const attachments = message.attachments.length
		? `<p>Attachments: ${message.attachments.map(describeAttachment).join('; ')}</p>`
		: '';
	return `<article>
<h2>${escapeHtml(message.subject || '(no subject)')}</h2>
<dl>
<dt>From</dt><dd>${escapeHtml(message.from)}</dd>
<dt>To</dt><dd>${escapeHtml(message.to.join(', '))}</dd>
<dt>Received</dt><dd><time datetime="${escapeHtml(message.date)}">${escapeHtml(message.date)}</time></dd>
<dt>Id</dt><dd><a href="/api/messages/${escapeHtml(encodeURIComponent(message.id))}">${escapeHtml(message.id)}</a></dd>
</dl>
${attachments}<pre>${linkify(message.text)}</pre>
</article>`;
}

function renderPage(messages, to) {
	const heading = to ? `Messages to ${escapeHtml(to)}` : 'All messages';
	const body = messages.length ? messages.map(renderMessage).join('\n') : '<p>No messages.</p>';
	return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Local inbox (${messages.length})</title>
<style>
body { font: 16px/1.5 system-ui, sans-serif; margin: 0 auto; max-width: 60rem; padding: 1rem; color: #1a1a1a; }
article { border-top: 1px solid #888; padding: 0.5rem 0 1rem; }
h2 { font-size: 1.15rem; margin: 0.5rem 0; }
dl { display: grid; grid-template-columns: max-content 1fr; gap: 0 1rem; margin: 0; }
dt { font-weight: 600; }
dd { margin: 0; overflow-wrap: anywhere; }
pre { white-space: pre-wrap; overflow-wrap: anywhere; background: #f3f3f3; padding: 0.75rem; }
a { color: #0645ad; }
</style>
</head>
<body>
<main>
<h1>Local inbox</h1>
<form method="get" action="/">
<label for="to">Recipient</label>
<input id="to" name="to" type="email" value="${escapeHtml(to ?? '')}">
<button type="submit">Filter</button>
<a href="/">Show all</a>
</form>
<p>${heading}: ${messages.length}, newest first.</p>
${body}
</main>
</body>
</html>
`;
}

// ---------------------------------------------------------------- start / stop

/**
 * Starts the SMTP listener and the HTTP inbox. Ports may be 0 (any free port);
 * the ports actually bound are returned. close() resolves once both are shut.
 */
export async function startMailFake({
	smtpPort = 1025,
	httpPort = 1080,
	host = '127.0.0.1',
	storeFile
} = {}) {
	const inbox = createInbox(await loadMessages(storeFile), storeFile);
	const smtp = createSmtpServer(inbox);
	const web = createHttpServer(inbox);

	const boundSmtp = await listenSmtp(smtp, smtpPort, host);
	let boundHttp;
	try {
		boundHttp = await listenHttp(web, httpPort, host);
	} catch (error) {
		await closeSmtp(smtp);
		throw error;
	}

	let closing;
	return {
		smtpPort: boundSmtp,
		httpPort: boundHttp,
		close() {
			closing ??= Promise.all([closeSmtp(smtp), closeHttp(web)]).then(() => inbox.flushed());
			return closing;
		}
	};
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
		throw new Error(`mail fake: ${name} must be a port number, got "${raw}"`);
	}
	return port;
}

async function main() {
	const host = process.env.MAIL_HOST || '127.0.0.1';
	const fake = await startMailFake({
		smtpPort: portFromEnv('MAIL_SMTP_PORT', 1025),
		httpPort: portFromEnv('MAIL_HTTP_PORT', 1080),
		host,
		storeFile: process.env.MAIL_STORE || undefined
	});
	const shown = host.includes(':') ? `[${host}]` : host;
	console.log(
		`mail fake: smtp://${shown}:${fake.smtpPort} inbox http://${shown}:${fake.httpPort}/`
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
