/**
 * Work whose cost or outcome must not show in the answer, such as mail that
 * goes only to an address with an account: it starts once the caller has
 * moved on, a failure is logged rather than thrown, and the promise handed
 * back settles when the work is done, so tests can wait for it and routes
 * need not. Work still queued when the process stops is lost, like a request
 * in flight.
 */
export function afterResponse(label: string, work: () => Promise<void>): Promise<void> {
	return new Promise<void>((resolve) => setImmediate(resolve))
		.then(work)
		.catch((error: unknown) => {
			console.error(`${label} failed after the answer was sent:`, error);
		});
}
