import nodemailer, { type Transporter } from 'nodemailer';
import { mailSettings, type MailSettings } from '../settings';
import type { MailContent } from './templates';

let transporter: { key: string; transport: Transporter } | undefined;

function smtpTransport(settings: MailSettings): Transporter {
	const key = JSON.stringify([settings.host, settings.port, settings.secure, settings.auth]);
	if (transporter?.key !== key) {
		transporter = {
			key,
			transport: nodemailer.createTransport({
				host: settings.host,
				port: settings.port,
				secure: settings.secure,
				ignoreTLS: settings.host === '127.0.0.1' || settings.host === 'localhost',
				auth: settings.auth ?? undefined
			})
		};
	}
	return transporter.transport;
}

export async function sendMail(to: string, content: MailContent): Promise<void> {
	const settings = mailSettings();
	await smtpTransport(settings).sendMail({
		from: settings.from,
		to,
		subject: content.subject,
		text: content.text,
		html: content.html
	});
}
