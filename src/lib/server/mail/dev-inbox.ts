import { env } from '$env/dynamic/private';
import type { StoredMessage as SinkMessage } from '../../../../docker-local/mail-sink';

/** The dev inbox exists only when the local mail sink runs beside the app (never in production). */
export function devInboxEnabled(): boolean {
	return Boolean(env.MAIL_SINK_URL) && env.NODE_ENV !== 'production';
}

export async function listSinkMessages(): Promise<SinkMessage[]> {
	const response = await fetch(`${env.MAIL_SINK_URL}/messages`);
	if (!response.ok) throw new Error(`mail sink answered ${response.status}`);
	return response.json();
}
