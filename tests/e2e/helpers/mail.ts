/** Reads what the app sent to the local mail sink the browser tests run. */
import { expect } from '@playwright/test';
import { mailSinkHttpPort } from '../../../playwright.config';

interface SinkMessage {
	to: string[];
	subject: string;
	text: string;
}

export async function latestMailTo(address: string, subjectIncludes: string): Promise<SinkMessage> {
	let found: SinkMessage | undefined;
	await expect
		.poll(
			async () => {
				const response = await fetch(`http://127.0.0.1:${mailSinkHttpPort}/messages?to=${encodeURIComponent(address)}`);
				const messages = (await response.json()) as SinkMessage[];
				found = messages.find((m) => m.subject.includes(subjectIncludes));
				return Boolean(found);
			},
			{ timeout: 10_000, message: `a mail to ${address} about "${subjectIncludes}"` }
		)
		.toBe(true);
	return found!;
}

export function firstLinkIn(text: string, pathPrefix: string): string {
	const match = text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/\//g, '\\/')}[^\\s]+`));
	if (!match) throw new Error(`no ${pathPrefix} link in:\n${text}`);
	return match[0];
}
