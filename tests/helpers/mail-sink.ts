/**
 * The local SMTP sink (docker-local/mail-sink.ts) on free ports for one test
 * file, with the app's mailer pointed at it.
 */
import { startMailSink, type StoredMessage } from '../../docker-local/mail-sink';
import { setAppEnv } from './app-env';
import { freePort } from './free-port';

export interface TestMailSink {
	url: string;
	messagesTo: (address: string) => Promise<StoredMessage[]>;
	clear: () => Promise<void>;
	stop: () => Promise<void>;
}

export async function startTestMailSink(): Promise<TestMailSink> {
	const smtpPort = await freePort();
	const httpPort = await freePort();
	const sink = await startMailSink(smtpPort, httpPort);
	const url = `http://127.0.0.1:${httpPort}`;
	setAppEnv({ SMTP_HOST: '127.0.0.1', SMTP_PORT: String(smtpPort), MAIL_SINK_URL: url });
	return {
		url,
		messagesTo: async (address) => {
			const response = await fetch(`${url}/messages?to=${encodeURIComponent(address)}`);
			return (await response.json()) as StoredMessage[];
		},
		clear: async () => {
			await fetch(`${url}/messages`, { method: 'DELETE' });
		},
		stop: sink.stop
	};
}

/** The token at the end of the first link to `path` in a message's plain text. */
export function tokenFromMessage(message: StoredMessage, path: string): string {
	const match = new RegExp(`${path}/([a-z0-9]+)`).exec(message.text);
	if (!match) throw new Error(`no ${path} link in: ${message.text}`);
	return match[1];
}
