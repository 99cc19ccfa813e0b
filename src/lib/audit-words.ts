/**
 * The audit log in words: who did it, what each recorded event means, to whom
 * or to what, and its details as a short sentence rather than raw keys. Safe
 * to import in the browser.
 */
import { localeName } from './locale/locales';
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
	'billing-changed': 'Changed the plan or seats',
	'billing-synced': 'Plan or seats changed at Stripe',
	'scenario-saved': 'Saved a scenario',
	'scenario-restored': 'Restored an earlier revision',
	'scenario-deleted': 'Deleted a scenario for good',
	'upload-applied': 'Applied an upload',
	'scenario-exported': 'Exported a scenario',
	'project-renamed': 'Renamed a project',
	'project-currency-changed': "Changed a project's currency",
	'project-archived': 'Archived a project',
	'project-restored': 'Restored a project',
	'workspace-settings-changed': 'Changed a workspace setting'
};

/** The kinds of event the log's filter offers, in words. */
export const auditGroupWords: Record<string, string> = {
	accounts: 'Sign-ins and passwords',
	members: 'Members and invitations',
	tokens: 'API tokens',
	billing: 'Plan, billing and settings',
	work: 'Projects and scenarios',
	exports: 'Exports'
};

const settingWords: Record<string, string> = { numberLocale: 'number and date style' };

/** A stored locale tag in words ("German (Germany)"), or the readers' own. */
function localeWords(value: unknown): string {
	const tag = text(value);
	return tag === 'reader' ? "each reader's own" : localeName(tag);
}

const accessWords: Record<string, string> = { read: 'read only', 'read-write': 'read and write' };

function text(value: unknown): string {
	return typeof value === 'string' || typeof value === 'number' ? String(value) : '';
}

const exportWords: Record<string, string> = { xlsx: 'Spreadsheet (XLSX)', csv: 'CSV', pdf: 'PDF summary' };
const tableWords: Record<string, string> = { 'cash-flow': 'annual cash-flow table', metrics: 'metrics', assumptions: 'assumptions' };

/** Who did it: the member's name and address, or what acted when no person did (Stripe's sync). */
export function describeAuditActor(event: string, actor: { name: string; email: string }): string {
	if (event === 'billing-synced') return 'Stripe (billing sync)';
	if (actor.name && actor.email) return `${actor.name} (${actor.email})`;
	return actor.name || actor.email || 'someone no longer here';
}

function scenarioWords(detail: Record<string, unknown>): string {
	return `"${text(detail.scenario)}" in ${text(detail.project)}`;
}

/** To whom or to what: the member, token, scenario or project acted on, by the name it had then. */
export function describeAuditTarget(event: string, detail: Record<string, unknown>): string {
	switch (event) {
		case 'role-changed':
		case 'member-removed': {
			const name = text(detail.memberName);
			const email = text(detail.memberEmail);
			return name && email ? `${name} (${email})` : name || email || 'a member';
		}
		case 'invitation-sent':
			return text(detail.email);
		case 'api-token-created':
		case 'api-token-revoked':
			return `token "${text(detail.token)}"`;
		case 'scenario-saved':
		case 'scenario-restored':
		case 'scenario-deleted':
		case 'upload-applied':
		case 'scenario-exported':
			return scenarioWords(detail);
		case 'project-renamed':
		case 'project-currency-changed':
		case 'project-archived':
		case 'project-restored':
			return `project ${text(detail.project)}`;
		case 'billing-changed':
		case 'billing-synced':
			return 'the plan';
		case 'workspace-settings-changed':
			return settingWords[text(detail.setting)] ?? text(detail.setting);
	}
	return '';
}

function billingSyncWords(detail: Record<string, unknown>): string {
	const parts: string[] = [];
	if (detail.planTo !== undefined) parts.push(`plan ${text(detail.planFrom)} → ${text(detail.planTo)}`);
	if (detail.statusTo !== undefined) parts.push(`standing ${text(detail.statusFrom)} → ${text(detail.statusTo)}`);
	if (detail.seatsTo !== undefined) parts.push(detail.seatsFrom === null ? `${text(detail.seatsTo)} seats` : `seats ${text(detail.seatsFrom)} → ${text(detail.seatsTo)}`);
	if (detail.cancelAtPeriodEnd !== undefined) parts.push(detail.cancelAtPeriodEnd ? 'to end at the close of the period' : 'to renew as before');
	return parts.join(', ');
}

/** "from EUR to USD, the money of 2 scenarios converted at 1.0825 USD per EUR". */
function currencyChangeWords(detail: Record<string, unknown>): string {
	const from = text(detail.from);
	const to = text(detail.to);
	const count = Number(detail.scenarios) === 1 ? 'one scenario' : `${text(detail.scenarios)} scenarios`;
	if (detail.amounts === 'converted') return `from ${from} to ${to}, the money of ${count} converted at ${text(detail.rate)} ${to} per ${from}`;
	if (detail.amounts === 'kept') return `from ${from} to ${to}, the money of ${count} kept as it was (not converted)`;
	return `from ${from} to ${to}; no scenario held money in ${from}`;
}

/** "with token "Nightly export"" when a script did it with a token, else ''. */
function viaToken(detail: Record<string, unknown>): string {
	return detail.token ? ` with token "${text(detail.token)}"` : '';
}

/** The details of one event as a sentence: `GET /api/v1/workspaces → 200 with token "Nightly export"`. */
export function describeAuditDetail(event: string, detail: Record<string, unknown>): string {
	const token = text(detail.token);
	switch (event) {
		case 'scenario-saved':
			return `as revision ${text(detail.revision)}${viaToken(detail)}`;
		case 'scenario-deleted':
			return `last saved as revision ${text(detail.revision)}${viaToken(detail)}`;
		case 'scenario-restored':
			return `revision ${text(detail.restoredFrom)} saved again as revision ${text(detail.revision)}`;
		case 'upload-applied':
			return `${text(detail.kind)} "${text(detail.upload)}" into ${text(detail.section)}, as revision ${text(detail.revision)}${viaToken(detail)}`;
		case 'scenario-exported': {
			const what = exportWords[text(detail.format)] ?? text(detail.format);
			const table = detail.format === 'csv' ? `, ${tableWords[text(detail.table)] ?? text(detail.table)}` : '';
			return `${what}${table} of revision ${text(detail.revision)}${viaToken(detail)}`;
		}
		case 'project-renamed':
			return `was ${text(detail.from)}${viaToken(detail)}`;
		case 'project-currency-changed':
			return `${currencyChangeWords(detail)}${viaToken(detail)}`;
		case 'project-archived':
		case 'project-restored':
			return viaToken(detail).trim();
		case 'billing-synced':
			return billingSyncWords(detail);
		case 'role-changed':
			return `from ${text(detail.from)} to ${text(detail.to)}`;
		case 'member-removed':
			return '';
		case 'api-token-used':
			return `${text(detail.method)} ${text(detail.path)} → ${text(detail.status)} with token "${token}"`;
		case 'api-token-refused':
			return `${text(detail.method)} ${text(detail.path)} refused: token "${token}" is ${text(detail.reason)}`;
		case 'api-token-created':
			return `${accessWords[text(detail.access)] ?? text(detail.access)}, expires ${text(detail.expiresAt).slice(0, 10)}`;
		case 'api-token-revoked':
			return '';
		case 'invitation-sent':
			return `as ${text(detail.role)}`;
		case 'invitation-accepted':
			return `as ${text(detail.role)}`;
		case 'workspace-settings-changed':
			return `from ${localeWords(detail.from)} to ${localeWords(detail.to)}`;
		case 'billing-changed':
			return detail.change === 'seats' ? `seats set to ${text(detail.seats)}` : detail.change === 'resume' ? 'plan resumed' : 'plan to end at the close of the period';
	}
	return Object.entries(detail)
		.filter(([key]) => !key.endsWith('Id'))
		.map(([key, value]) => `${key}: ${text(value)}`)
		.join(', ');
}
