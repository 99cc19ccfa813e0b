import { describe, expect, it } from 'vitest';
import { auditEventWords, auditGroupWords, describeAuditActor, describeAuditDetail, describeAuditTarget } from './audit-words';
import { auditEventGroups } from './server/db/audit';

describe('auditEventWords', () => {
	it('has words for every event the log records, and for every kind the filter offers', () => {
		const recorded = Object.values(auditEventGroups).flat();
		for (const event of recorded) expect(auditEventWords[event], event).toBeTruthy();
		for (const group of Object.keys(auditEventGroups)) expect(auditGroupWords[group], group).toBeTruthy();
	});
});

describe('describeAuditActor', () => {
	it('names the member with their address, and Stripe for its sync', () => {
		expect(describeAuditActor('scenario-saved', { name: 'Isla Penrow', email: 'isla@example.test' })).toBe('Isla Penrow (isla@example.test)');
		expect(describeAuditActor('sign-in-failed', { name: '', email: 'who@example.test' })).toBe('who@example.test');
		expect(describeAuditActor('billing-synced', { name: '', email: '' })).toBe('Stripe (billing sync)');
	});
});

describe('describeAuditTarget', () => {
	it('names the member, the token, the scenario or the project acted on, as they were named then', () => {
		expect(describeAuditTarget('member-removed', { memberId: 'x', memberName: 'Tor Vell', memberEmail: 'tor@example.test' })).toBe('Tor Vell (tor@example.test)');
		expect(describeAuditTarget('member-removed', { memberId: 'x' })).toBe('a member');
		expect(describeAuditTarget('api-token-revoked', { token: 'CI', tokenId: 'x' })).toBe('token "CI"');
		expect(describeAuditTarget('scenario-saved', { scenario: 'Base case', project: 'Skerry Sound', revision: 4 })).toBe('"Base case" in Skerry Sound');
		expect(describeAuditTarget('project-renamed', { project: 'Skerry Sound II', from: 'Skerry Sound' })).toBe('project Skerry Sound II');
	});
});

describe('describeAuditDetail', () => {
	it('reads a token call as a sentence, without ids', () => {
		const line = describeAuditDetail('api-token-used', { token: 'Nightly export', tokenId: 'f00', method: 'GET', path: '/api/v1/workspaces', status: 200 });
		expect(line).toBe('GET /api/v1/workspaces → 200 with token "Nightly export"');
	});

	it('names why a token was refused', () => {
		expect(describeAuditDetail('api-token-refused', { token: 'Old', reason: 'revoked', method: 'POST', path: '/api/v1/x', status: 401 })).toBe(
			'POST /api/v1/x refused: token "Old" is revoked'
		);
	});

	it('gives a created token’s access and expiry date in words (its name is the target)', () => {
		expect(describeAuditDetail('api-token-created', { token: 'CI', access: 'read', expiresAt: '2027-03-02T03:18:52.071Z', tokenId: 'x' })).toBe('read only, expires 2027-03-02');
	});

	it('says which revision a save, a restore or an upload made, and what an export held', () => {
		expect(describeAuditDetail('scenario-saved', { revision: 5 })).toBe('as revision 5');
		expect(describeAuditDetail('scenario-saved', { revision: 5, token: 'Nightly' })).toBe('as revision 5 with token "Nightly"');
		expect(describeAuditDetail('scenario-restored', { revision: 6, restoredFrom: 2 })).toBe('revision 2 saved again as revision 6');
		expect(describeAuditDetail('upload-applied', { kind: 'Power curve', upload: 'curve.csv', section: 'device', revision: 3 })).toBe(
			'Power curve "curve.csv" into device, as revision 3'
		);
		expect(describeAuditDetail('scenario-exported', { format: 'csv', table: 'metrics', revision: 2 })).toBe('CSV, metrics of revision 2');
		expect(describeAuditDetail('scenario-exported', { format: 'xlsx', revision: 2 })).toBe('Spreadsheet (XLSX) of revision 2');
	});

	it("says what a project's new currency did to the money of its scenarios", () => {
		expect(describeAuditDetail('project-currency-changed', { from: 'EUR', to: 'USD', amounts: 'converted', rate: '1.0825', scenarios: 2 })).toBe(
			'from EUR to USD, the money of 2 scenarios converted at 1.0825 USD per EUR'
		);
		expect(describeAuditDetail('project-currency-changed', { from: 'EUR', to: 'GBP', amounts: 'kept', scenarios: 1, token: 'CI' })).toBe(
			'from EUR to GBP, the money of one scenario kept as it was (not converted) with token "CI"'
		);
		expect(describeAuditDetail('project-currency-changed', { from: 'EUR', to: 'NOK', amounts: 'none', scenarios: 0 })).toBe('from EUR to NOK; no scenario held money in EUR');
		expect(describeAuditTarget('project-currency-changed', { project: 'Skerry Sound', from: 'EUR', to: 'USD' })).toBe('project Skerry Sound');
	});

	it('reads what a sync from Stripe changed', () => {
		expect(describeAuditDetail('billing-synced', { source: 'stripe', seatsFrom: 3, seatsTo: 5 })).toBe('seats 3 → 5');
		expect(describeAuditDetail('billing-synced', { source: 'stripe', planFrom: 'free', planTo: 'team', seatsFrom: null, seatsTo: 3 })).toBe('plan free → team, 3 seats');
		expect(describeAuditDetail('billing-synced', { source: 'stripe', cancelAtPeriodEnd: true })).toBe('to end at the close of the period');
	});

	it('falls back to key and value for other events, leaving ids out', () => {
		expect(describeAuditDetail('member-left', { memberId: 'abc', note: 'left the firm' })).toBe('note: left the firm');
	});
});
