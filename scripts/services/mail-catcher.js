// @ts-check
/**
 * The local mail catcher: an SMTP server on loopback that stores every message under storage/
 * (it replies "250" only after the message is on disk, so a test that sent a mail can read it at once)
 * and a small web page and JSON API to read them:
 *   GET /                    list of messages (HTML)
 *   GET /messages/:id        one message (HTML; the HTML part sandboxed in an iframe)
 *   GET /api/messages        JSON list, newest first; ?to=address filters by recipient
 *   GET /api/messages/:id    JSON of one message
 *   DELETE /api/messages     remove all
 * Usage: node scripts/services/mail-catcher.js --smtp-port 54332 --web-port 54333 --directory storage/local/mail
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const { values } = parseArgs({
	options: {
		'smtp-port': { type: 'string', default: '54332' },
		'web-port': { type: 'string', default: '54333' },
		address: { type: 'string', default: '127.0.0.1' },
		directory: { type: 'string' }
	}
});
if (!values.directory) throw new Error('--directory is required');
const dir = values.directory;
fs.mkdirSync(dir, { recursive: true });

/** @typedef {{ id: string, receivedAt: string, from: string, to: string[], subject: string, text: string, html: string | null }} StoredMessage */

const smtp = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	logger: false,
	size: 25 * 1024 * 1024,
	onAuth(_auth, _session, callback) {
		callback(null, { user: 'catcher' });
	},
	onData(stream, session, callback) {
		simpleParser(stream)
			.then((parsed) => {
				const to = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
				/** @type {StoredMessage} */
				const message = {
					id: `${Date.now()}-${crypto.randomBytes(4).toString('hex')}`,
					receivedAt: new Date().toISOString(),
					from: parsed.from?.text ?? (session.envelope.mailFrom || { address: '' }).address,
					to,
					subject: parsed.subject ?? '',
					text: parsed.text ?? '',
					html: typeof parsed.html === 'string' ? parsed.html : null
				};
				fs.writeFileSync(path.join(dir, `${message.id}.json`), JSON.stringify(message, null, 2));
				callback();
			})
			.catch((err) => callback(err));
	}
});
smtp.on('error', (err) => console.error('smtp error', err.message));

/** @returns {StoredMessage[]} */
function readAll() {
	return fs
		.readdirSync(dir)
		.filter((f) => f.endsWith('.json'))
		.sort()
		.reverse()
		.map((f) => JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')));
}

/** @param {string} s */
const escapeHtml = (s) =>
	s.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c
	);

const page = (/** @type {string} */ title, /** @type {string} */ body) => `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title>
<style>body{font-family:system-ui,sans-serif;margin:2rem;color:#1c242d;max-width:60rem}
table{border-collapse:collapse;width:100%}td,th{padding:.4rem .6rem;border-bottom:1px solid #c7d0d6;text-align:left}
a{color:#904217}pre{white-space:pre-wrap;background:#f4f6f7;padding:1rem}iframe{width:100%;height:28rem;border:1px solid #c7d0d6}</style>
</head><body>${body}</body></html>`;

const web = http.createServer((req, res) => {
	const url = new URL(req.url ?? '/', 'http://localhost');
	const send = (
		/** @type {number} */ status,
		/** @type {string} */ type,
		/** @type {string} */ body
	) => {
		res.writeHead(status, { 'content-type': type, 'cache-control': 'no-store' });
		res.end(body);
	};
	const messageId = url.pathname.match(/^\/(?:api\/)?messages\/([\w-]+)$/)?.[1];
	if (req.method === 'DELETE' && url.pathname === '/api/messages') {
		for (const f of fs.readdirSync(dir)) if (f.endsWith('.json')) fs.rmSync(path.join(dir, f));
		return send(200, 'application/json', '{"deleted":true}');
	}
	if (url.pathname === '/api/messages') {
		const to = url.searchParams.get('to')?.toLowerCase();
		const list = readAll().filter((m) => !to || m.to.includes(to));
		return send(200, 'application/json', JSON.stringify(list));
	}
	if (messageId) {
		const file = path.join(dir, `${messageId}.json`);
		if (!fs.existsSync(file)) return send(404, 'text/plain', 'no such message');
		/** @type {StoredMessage} */
		const m = JSON.parse(fs.readFileSync(file, 'utf8'));
		if (url.pathname.startsWith('/api/')) return send(200, 'application/json', JSON.stringify(m));
		const html = m.html
			? `<h2>HTML part</h2><iframe sandbox="" srcdoc="${escapeHtml(m.html)}"></iframe>`
			: '';
		return send(
			200,
			'text/html; charset=utf-8',
			page(
				m.subject,
				`<p><a href="/">← all messages</a></p><h1>${escapeHtml(m.subject)}</h1>
<p>From ${escapeHtml(m.from)} to ${escapeHtml(m.to.join(', '))}, ${escapeHtml(m.receivedAt)}</p>
<h2>Plain text</h2><pre>${escapeHtml(m.text)}</pre>${html}`
			)
		);
	}
	if (url.pathname === '/') {
		const rows = readAll()
			.map(
				(m) =>
					`<tr><td>${escapeHtml(m.receivedAt)}</td><td>${escapeHtml(m.to.join(', '))}</td><td><a href="/messages/${m.id}">${escapeHtml(m.subject || '(no subject)')}</a></td></tr>`
			)
			.join('');
		return send(
			200,
			'text/html; charset=utf-8',
			page(
				'Thermalith local mail',
				`<h1>Mail caught by the local SMTP server</h1><p>Nothing here was delivered anywhere; this is the development mail catcher.</p>
<table><thead><tr><th>Received</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows || '<tr><td colspan="3">No messages yet.</td></tr>'}</tbody></table>`
			)
		);
	}
	send(404, 'text/plain', 'not found');
});

smtp.listen(Number(values['smtp-port']), values.address, () => {
	console.log(`SMTP catcher on ${values.address}:${values['smtp-port']}`);
});
web.listen(Number(values['web-port']), values.address, () => {
	console.log(`mail viewer on http://${values.address}:${values['web-port']}`);
});

for (const signal of /** @type {const} */ (['SIGINT', 'SIGTERM'])) {
	process.on(signal, () => {
		web.close();
		smtp.close(() => process.exit(0));
		setTimeout(() => process.exit(0), 2000).unref();
	});
}
