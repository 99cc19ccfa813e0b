/**
 * Errors in Stripe's own shape, so the SDK raises the class the app expects:
 * 400/404 -> StripeInvalidRequestError, 402 -> StripeCardError,
 * 401 -> StripeAuthenticationError, 400 idempotency_error -> StripeIdempotencyError.
 */
export type StandinErrorType = 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error';

export class StandinError extends Error {
	constructor(
		readonly status: 400 | 401 | 402 | 404 | 405 | 409 | 500,
		message: string,
		readonly param?: string,
		readonly code?: string,
		readonly type: StandinErrorType = status === 402 ? 'card_error' : 'invalid_request_error',
		readonly declineCode?: string
	) {
		super(message);
	}

	toJSON() {
		return {
			error: {
				type: this.type,
				message: this.message,
				...(this.param ? { param: this.param } : {}),
				...(this.code ? { code: this.code } : {}),
				...(this.declineCode ? { decline_code: this.declineCode } : {})
			}
		};
	}
}

export function missingResource(kind: string, id: string, param = 'id'): StandinError {
	return new StandinError(404, `No such ${kind}: '${id}'`, param, 'resource_missing');
}

export function cardDeclined(): StandinError {
	return new StandinError(402, 'Your card was declined.', undefined, 'card_declined', 'card_error', 'generic_decline');
}
