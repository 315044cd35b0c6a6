// Local inbox: an SMTP sink on loopback plus a small web page listing what arrived.
// The app sends through nodemailer to SMTP_URL, so a real provider is configuration only.
//   PINCER_SMTP_PORT (default 2525)   PINCER_INBOX_PORT (default 3025)
import { createServer, type ServerResponse } from 'node:http';
import { simpleParser, type ParsedMail } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { escapeHtml, renderList, renderMessage } from './pages.ts';

export type StoredMessage = {
	id: number;
	receivedAt: string;
	envelopeTo: string[];
	from: string;
	to: string;
	subject: string;
	text: string;
	html: string | null;
	attachments: { filename: string; contentType: string; size: number; content: Buffer }[];
};

const smtpPort = Number(process.env.PINCER_SMTP_PORT ?? 2525);
const webPort = Number(process.env.PINCER_INBOX_PORT ?? 3025);
const LIMIT = 500;
const messages: StoredMessage[] = [];
let nextId = 1;

function store(parsed: ParsedMail, envelopeTo: string[]) {
	const address = (a: ParsedMail['to']) =>
		Array.isArray(a) ? a.map((x) => x.text).join(', ') : (a?.text ?? '');
	messages.unshift({
		id: nextId++,
		receivedAt: new Date().toISOString(),
		envelopeTo,
		from: address(parsed.from),
		to: address(parsed.to),
		subject: parsed.subject ?? '(no subject)',
		text: parsed.text ?? '',
		html: typeof parsed.html === 'string' ? parsed.html : null,
		attachments: parsed.attachments.map((a) => ({
			filename: a.filename ?? 'attachment',
			contentType: a.contentType,
			size: a.size,
			content: a.content
		}))
	});
	messages.length = Math.min(messages.length, LIMIT);
}

const smtp = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	banner: 'Pincer local inbox',
	size: 25 * 1024 * 1024,
	onAuth(_auth, _session, callback) {
		callback(null, { user: 'local' });
	},
	onData(stream, session, callback) {
		simpleParser(stream)
			.then((parsed) => {
				store(
					parsed,
					session.envelope.rcptTo.map((r) => r.address)
				);
				callback();
			})
			.catch((err: Error) => callback(err));
	}
});

function send(res: ServerResponse, status: number, type: string, body: string | Buffer) {
	res.writeHead(status, {
		'content-type': type,
		'cache-control': 'no-store',
		'content-security-policy':
			"default-src 'none'; style-src 'unsafe-inline'; img-src data:; frame-src 'self'"
	});
	res.end(body);
}

const web = createServer((req, res) => {
	const url = new URL(req.url ?? '/', `http://127.0.0.1:${webPort}`);
	const parts = url.pathname.split('/').filter(Boolean);
	const find = (id: string | undefined) => messages.find((m) => m.id === Number(id));

	if (url.pathname === '/api/messages' && req.method === 'GET') {
		const to = url.searchParams.get('to')?.toLowerCase();
		const list = messages
			.filter((m) => !to || m.envelopeTo.some((a) => a.toLowerCase() === to))
			.map(({ attachments, ...m }) => ({
				...m,
				attachments: attachments.map(({ content: _content, ...a }, index) => ({
					...a,
					url: `/messages/${m.id}/attachments/${index}`
				}))
			}));
		return send(res, 200, 'application/json', JSON.stringify(list));
	}
	if (url.pathname === '/api/messages' && req.method === 'DELETE') {
		messages.length = 0;
		return send(res, 200, 'application/json', '{"cleared":true}');
	}
	if (req.method !== 'GET') return send(res, 405, 'text/plain', 'method not allowed');
	if (parts.length === 0) return send(res, 200, 'text/html; charset=utf-8', renderList(messages));
	if (parts[0] === 'messages') {
		const message = find(parts[1]);
		if (!message) return send(res, 404, 'text/plain', 'no such message');
		if (parts.length === 2)
			return send(res, 200, 'text/html; charset=utf-8', renderMessage(message));
		if (parts[2] === 'html' && message.html) {
			// Shown in a sandboxed frame: no scripts, no forms, no requests anywhere.
			res.writeHead(200, {
				'content-type': 'text/html; charset=utf-8',
				'content-security-policy':
					"sandbox; default-src 'none'; style-src 'unsafe-inline'; img-src data:"
			});
			return res.end(message.html);
		}
		if (parts[2] === 'attachments') {
			const attachment = message.attachments[Number(parts[3])];
			if (!attachment) return send(res, 404, 'text/plain', 'no such attachment');
			res.writeHead(200, {
				'content-type': attachment.contentType,
				'content-disposition': `attachment; filename="${attachment.filename.replace(/"/g, '')}"`
			});
			return res.end(attachment.content);
		}
	}
	send(res, 404, 'text/html; charset=utf-8', `<p>Nothing at ${escapeHtml(url.pathname)}</p>`);
});

smtp.listen(smtpPort, '127.0.0.1', () => {
	web.listen(webPort, '127.0.0.1', () => {
		console.log(`inbox ready: smtp://127.0.0.1:${smtpPort} web http://127.0.0.1:${webPort}`);
	});
});
smtp.on('error', (err) => {
	console.error(`inbox SMTP error: ${err.message}`);
	process.exit(1);
});
web.on('error', (err) => {
	console.error(`inbox web error: ${err.message}`);
	process.exit(1);
});

function shutdown() {
	web.close();
	smtp.close(() => process.exit(0));
	setTimeout(() => process.exit(0), 2000).unref();
}
process.on('SIGTERM', shutdown);
process.on('SIGINT', shutdown);
