import type { HandleServerError } from '@sveltejs/kit';
import { randomUUID } from 'node:crypto';

/** Log the real error on the server; show the user a safe message with an id to quote. */
export const handleError: HandleServerError = ({ error, status, message }) => {
	if (status === 404) return { message };
	const errorId = randomUUID();
	console.error(`[error ${errorId}]`, error);
	const databaseDown = isConnectionError(error);
	return {
		message: databaseDown
			? 'The database is not answering right now. Your saved work is safe; try again in a moment.'
			: 'Something went wrong on our side.',
		errorId
	};
};

function isConnectionError(error: unknown): boolean {
	const text = error instanceof Error ? `${error.name} ${error.message} ${(error as { code?: string }).code ?? ''}` : '';
	return /ECONNREFUSED|ECONNRESET|KnexTimeoutError|57P01|Connection terminated/i.test(text);
}
