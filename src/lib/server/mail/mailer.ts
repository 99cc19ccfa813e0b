import nodemailer, { type Transporter } from 'nodemailer';
import { env } from '$env/dynamic/private';
import type { MailContent } from './templates';

let transporter: Transporter | undefined;

function smtpTransport(): Transporter {
	if (!env.SMTP_HOST) {
		throw new Error('SMTP_HOST is not set: Tidewright cannot send mail. `npm start` sets it to the local mail sink.');
	}
	transporter ??= nodemailer.createTransport({
		host: env.SMTP_HOST,
		port: Number(env.SMTP_PORT ?? 587),
		secure: env.SMTP_SECURE === 'true',
		ignoreTLS: env.SMTP_HOST === '127.0.0.1' || env.SMTP_HOST === 'localhost',
		auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined
	});
	return transporter;
}

export async function sendMail(to: string, content: MailContent): Promise<void> {
	await smtpTransport().sendMail({
		from: env.MAIL_FROM ?? 'Tidewright <no-reply@tidewright.example>',
		to,
		subject: content.subject,
		text: content.text,
		html: content.html
	});
}
