import { mailSinkUrl, webSettings } from '../settings';
import type { StoredMessage as SinkMessage } from '../../../../docker-local/mail-sink';

/** The dev inbox exists only when the local mail sink runs beside the app (never in production). */
export function devInboxEnabled(): boolean {
	return mailSinkUrl() !== null && !webSettings().production;
}

export async function listSinkMessages(): Promise<SinkMessage[]> {
	const response = await fetch(`${mailSinkUrl()}/messages`);
	if (!response.ok) throw new Error(`mail sink answered ${response.status}`);
	return response.json();
}
