/**
 * A local SMTP server for development and tests: it accepts every message (or refuses them on
 * request, to test retries) and keeps them in memory, readable over HTTP on loopback:
 *   GET    /messages[?to=address]   captured messages, newest first
 *   DELETE /messages                forget them
 *   POST   /refuse?count=N          refuse the next N messages with a temporary failure (451)
 *   POST   /refuse?until=off        stop refusing
 * Ports: SMTP_FAKE_PORT (2525) and SMTP_FAKE_HTTP_PORT (2526), both on 127.0.0.1.
 */
import http from 'node:http';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const smtpPort = Number(process.env.SMTP_FAKE_PORT ?? 2525);
const httpPort = Number(process.env.SMTP_FAKE_HTTP_PORT ?? 2526);
const host = '127.0.0.1';
const LIMIT = 5000;

/** @type {{ id: number, from: string, to: string[], subject: string, text: string, html: string, date: string }[]} */
let messages = [];
let nextId = 1;
let refuseLeft = 0;
let refusedCount = 0;

const smtp = new SMTPServer({
	disabledCommands: ['STARTTLS', 'AUTH'],
	authOptional: true,
	logger: false,
	size: 10 * 1024 * 1024,
	onRcptTo(address, _session, callback) {
		if (refuseLeft > 0) {
			refuseLeft -= 1;
			refusedCount += 1;
			const err = /** @type {Error & { responseCode?: number }} */ (
				new Error('Mailbox temporarily unavailable, try again later')
			);
			err.responseCode = 451;
			return callback(err);
		}
		callback();
	},
	onData(stream, session, callback) {
		simpleParser(stream)
			.then((mail) => {
				messages.unshift({
					id: nextId++,
					from: mail.from?.text ?? session.envelope.mailFrom?.address ?? '',
					to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
					subject: mail.subject ?? '',
					text: mail.text ?? '',
					html: typeof mail.html === 'string' ? mail.html : '',
					date: new Date().toISOString()
				});
				if (messages.length > LIMIT) messages.length = LIMIT;
				callback();
			})
			.catch((error) => callback(error));
	}
});

const web = http.createServer((req, res) => {
	const url = new URL(req.url ?? '/', `http://${host}`);
	const send = (status, body) => {
		res.writeHead(status, { 'content-type': 'application/json' });
		res.end(JSON.stringify(body));
	};
	if (url.pathname === '/messages' && req.method === 'GET') {
		const to = url.searchParams.get('to')?.toLowerCase();
		return send(200, to ? messages.filter((m) => m.to.includes(to)) : messages);
	}
	if (url.pathname === '/messages' && req.method === 'DELETE') {
		messages = [];
		return send(200, { ok: true });
	}
	if (url.pathname === '/refuse' && req.method === 'POST') {
		if (url.searchParams.get('until') === 'off') refuseLeft = 0;
		else refuseLeft = Math.max(0, Number(url.searchParams.get('count') ?? 1000000));
		return send(200, { refuseLeft });
	}
	if (url.pathname === '/health')
		return send(200, { ok: true, messages: messages.length, refusedCount });
	send(404, { error: 'not found' });
});

smtp.listen(smtpPort, host, () => {
	web.listen(httpPort, host, () => {
		console.log(
			`smtp fake: SMTP on ${host}:${smtpPort}, messages at http://${host}:${httpPort}/messages`
		);
	});
});

const stop = () => {
	web.close();
	smtp.close(() => process.exit(0));
	setTimeout(() => process.exit(0), 1000).unref();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
