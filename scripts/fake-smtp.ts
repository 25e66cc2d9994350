// A local fake SMTP server for development and tests: it accepts every message on loopback,
// keeps it in memory and lists it over HTTP (GET /messages, newest first) for the outbox page.
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import http from 'node:http';
import { randomUUID } from 'node:crypto';

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const apiPort = Number(new URL(process.env.FAKE_SMTP_API ?? 'http://127.0.0.1:2580').port);
const host = '127.0.0.1';
const MAX_KEPT = 500;

interface StoredMessage {
	id: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string;
	receivedAt: string;
}

const messages: StoredMessage[] = [];

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
	const list = Array.isArray(a) ? a : a ? [a] : [];
	return list.flatMap((o) => o.value.map((v) => v.address ?? '')).filter(Boolean);
}

const smtp = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	size: 5 * 1024 * 1024,
	onData(stream, session, callback) {
		simpleParser(stream)
			.then((parsed) => {
				const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
				messages.unshift({
					id: randomUUID(),
					from: parsed.from?.text ?? session.envelope.mailFrom?.toString() ?? '',
					to: envelopeTo.length ? envelopeTo : addresses(parsed.to),
					subject: parsed.subject ?? '',
					text: parsed.text ?? '',
					html: typeof parsed.html === 'string' ? parsed.html : '',
					receivedAt: new Date().toISOString()
				});
				messages.length = Math.min(messages.length, MAX_KEPT);
				callback();
			})
			.catch((err: Error) => callback(err));
	}
});

const api = http.createServer((req, res) => {
	const url = new URL(req.url ?? '/', `http://${host}`);
	if (url.pathname === '/messages' && req.method === 'GET') {
		const to = url.searchParams.get('to')?.toLowerCase();
		const list = to ? messages.filter((m) => m.to.some((t) => t.toLowerCase() === to)) : messages;
		res.writeHead(200, { 'content-type': 'application/json' });
		res.end(JSON.stringify(list));
		return;
	}
	if (url.pathname === '/messages' && req.method === 'DELETE') {
		messages.length = 0;
		res.writeHead(204).end();
		return;
	}
	res.writeHead(404, { 'content-type': 'application/json' });
	res.end(JSON.stringify({ error: 'not found' }));
});

smtp.listen(smtpPort, host, () => {
	api.listen(apiPort, host, () => {
		console.log(`fake SMTP on ${host}:${smtpPort}, messages at http://${host}:${apiPort}/messages`);
	});
});

function stop() {
	smtp.close(() => api.close(() => process.exit(0)));
	setTimeout(() => process.exit(0), 1000).unref();
}
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
