import { mailSinkUrl, webSettings } from '../settings';
import type { StoredMessage as SinkMessage } from '../../../../docker-local/mail-sink';

/**
 * The dev inbox shows every mail the app sent, password-reset links included,
 * so it exists only for a local demo: beside the local mail sink, never in
 * production, and only while the app listens on loopback alone. Pages behind
 * it also need a signed-in user (hooks.server.ts and the page's load).
 */
export function devInboxEnabled(): boolean {
	const web = webSettings();
	return mailSinkUrl() !== null && !web.production && web.loopbackOnly;
}

export async function listSinkMessages(): Promise<SinkMessage[]> {
	const response = await fetch(`${mailSinkUrl()}/messages`);
	if (!response.ok) throw new Error(`mail sink answered ${response.status}`);
	return response.json();
}
