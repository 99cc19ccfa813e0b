/**
 * The billing page's forms send the owner on to Stripe's checkout and portal
 * pages (a form POST answered by a redirect), which the app-wide policy's
 * `form-action 'self'` would block. Only that page's policy names those origins.
 */
const billingPage = /^\/app\/w\/[^/]+\/billing\/?$/;

export function isBillingPage(pathname: string): boolean {
	return billingPage.test(pathname);
}

/** The policy with `origins` added to its form-action directive (added as a directive if missing). */
export function withFormActionOrigins(policy: string, origins: readonly string[]): string {
	if (origins.length === 0) return policy;
	const directives = policy.split(';').map((d) => d.trim()).filter(Boolean);
	const index = directives.findIndex((d) => d.split(/\s+/)[0].toLowerCase() === 'form-action');
	if (index === -1) return [...directives, `form-action 'self' ${origins.join(' ')}`].join('; ');
	const sources = directives[index].split(/\s+/).slice(1).filter((s) => s !== "'none'");
	directives[index] = ['form-action', ...new Set([...sources, ...origins])].join(' ');
	return directives.join('; ');
}
