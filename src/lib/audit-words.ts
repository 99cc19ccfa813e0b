/**
 * The security log in words: what each recorded event means, and its details
 * as a short sentence rather than raw keys. Safe to import in the browser.
 */
export const auditEventWords: Record<string, string> = {
	'sign-in': 'Signed in',
	'sign-in-failed': 'Failed sign-in',
	'sign-in-blocked': 'Sign-in blocked (too many failures)',
	'sign-out': 'Signed out',
	'sign-out-everywhere': 'Signed out on every device',
	'sign-up': 'Made an account',
	'sign-up-existing-address': 'Someone tried to make a second account with this address',
	'email-verified': 'Confirmed e-mail address',
	'password-reset-requested': 'Asked for a password reset',
	'password-reset': 'Reset password by e-mail',
	'password-changed': 'Changed password',
	'role-changed': 'Changed a role',
	'member-removed': 'Removed a member',
	'member-left': 'Left the workspace',
	'invitation-sent': 'Sent an invitation',
	'invitation-revoked': 'Withdrew an invitation',
	'invitation-accepted': 'Accepted an invitation',
	'api-token-created': 'Created an API token',
	'api-token-revoked': 'Revoked an API token',
	'api-token-used': 'Called the API with a token',
	'api-token-refused': 'Refused an API token',
	'billing-changed': 'Changed the plan or seats'
};

const accessWords: Record<string, string> = { read: 'read only', 'read-write': 'read and write' };

function text(value: unknown): string {
	return typeof value === 'string' || typeof value === 'number' ? String(value) : '';
}

/** The details of one event as a sentence: `GET /api/v1/workspaces → 200 with token "Nightly export"`. */
export function describeAuditDetail(event: string, detail: Record<string, unknown>): string {
	const token = text(detail.token);
	switch (event) {
		case 'api-token-used':
			return `${text(detail.method)} ${text(detail.path)} → ${text(detail.status)} with token "${token}"`;
		case 'api-token-refused':
			return `${text(detail.method)} ${text(detail.path)} refused: token "${token}" is ${text(detail.reason)}`;
		case 'api-token-created':
			return `token "${token}", ${accessWords[text(detail.access)] ?? text(detail.access)}, expires ${text(detail.expiresAt).slice(0, 10)}`;
		case 'api-token-revoked':
			return `token "${token}"`;
		case 'role-changed':
			return `from ${text(detail.from)} to ${text(detail.to)}`;
		case 'invitation-sent':
			return `${text(detail.email)} as ${text(detail.role)}`;
		case 'invitation-accepted':
			return `as ${text(detail.role)}`;
		case 'billing-changed':
			return detail.change === 'seats' ? `seats set to ${text(detail.seats)}` : detail.change === 'resume' ? 'plan resumed' : 'plan to end at the close of the period';
	}
	return Object.entries(detail)
		.filter(([key]) => !key.endsWith('Id'))
		.map(([key, value]) => `${key}: ${text(value)}`)
		.join(', ');
}
