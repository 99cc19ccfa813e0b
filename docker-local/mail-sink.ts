/**
 * The local SMTP sink: accepts every message on loopback, keeps it in memory,
 * and shows them as JSON for the dev inbox page and the tests.
 *
 *   SMTP  127.0.0.1:MAIL_SINK_SMTP_PORT (default 54325)
 *   HTTP  127.0.0.1:MAIL_SINK_HTTP_PORT (default 54326): GET /messages, DELETE /messages
 */
import { createServer, type Server } from 'node:http';
import { randomUUID } from 'node:crypto';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';

export interface StoredMessage {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string;
}

const MAX_MESSAGES = 500;

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
	const list = Array.isArray(field) ? field : field ? [field] : [];
	return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

export interface MailSink {
	smtpPort: number;
	httpPort: number;
	stop: () => Promise<void>;
}

export async function startMailSink(smtpPort: number, httpPort: number): Promise<MailSink> {
	const messages: StoredMessage[] = [];

	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS', 'AUTH'],
		logger: false,
		size: 10 * 1024 * 1024,
		onData(stream, _session, callback) {
			simpleParser(stream)
				.then((parsed) => {
					messages.unshift({
						id: randomUUID(),
						receivedAt: new Date().toISOString(),
						from: addresses(parsed.from)[0] ?? '',
						to: addresses(parsed.to),
						subject: parsed.subject ?? '',
						text: parsed.text ?? '',
						html: typeof parsed.html === 'string' ? parsed.html : ''
					});
					messages.length = Math.min(messages.length, MAX_MESSAGES);
					callback();
				})
				.catch((error: Error) => callback(error));
		}
	});

	const http: Server = createServer((req, res) => {
		const url = new URL(req.url ?? '/', 'http://127.0.0.1');
		if (url.pathname === '/messages' && req.method === 'GET') {
			const to = url.searchParams.get('to')?.toLowerCase();
			const list = to ? messages.filter((m) => m.to.some((a) => a.toLowerCase() === to)) : messages;
			res.writeHead(200, { 'content-type': 'application/json' });
			res.end(JSON.stringify(list));
		} else if (url.pathname === '/messages' && req.method === 'DELETE') {
			messages.length = 0;
			res.writeHead(204).end();
		} else {
			res.writeHead(404, { 'content-type': 'application/json' }).end('{"error":"not found"}');
		}
	});

	await new Promise<void>((ok, fail) => {
		smtp.once('error', fail);
		smtp.listen(smtpPort, '127.0.0.1', () => ok());
	});
	await new Promise<void>((ok, fail) => {
		http.once('error', fail);
		http.listen(httpPort, '127.0.0.1', () => ok());
	});

	return {
		smtpPort,
		httpPort,
		stop: async () => {
			await new Promise<void>((ok) => smtp.close(() => ok()));
			await new Promise<void>((ok) => http.close(() => ok()));
		}
	};
}

export function mailSinkPortsFromEnv(env: NodeJS.ProcessEnv = process.env) {
	return { smtpPort: Number(env.MAIL_SINK_SMTP_PORT ?? 54325), httpPort: Number(env.MAIL_SINK_HTTP_PORT ?? 54326) };
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
	const { smtpPort, httpPort } = mailSinkPortsFromEnv();
	startMailSink(smtpPort, httpPort).then(() =>
		console.log(`mail sink: SMTP 127.0.0.1:${smtpPort}, messages at http://127.0.0.1:${httpPort}/messages`)
	);
}
