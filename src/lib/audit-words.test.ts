import { describe, expect, it } from 'vitest';
import { auditEventWords, describeAuditDetail } from './audit-words';
import { auditEventGroups } from './server/db/audit';

describe('auditEventWords', () => {
	it('has words for every event the log records', () => {
		const recorded = Object.values(auditEventGroups).flat();
		for (const event of recorded) expect(auditEventWords[event], event).toBeTruthy();
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

	it('gives a created token’s access and expiry date in words', () => {
		expect(describeAuditDetail('api-token-created', { token: 'CI', access: 'read', expiresAt: '2027-03-02T03:18:52.071Z', tokenId: 'x' })).toBe(
			'token "CI", read only, expires 2027-03-02'
		);
	});

	it('falls back to key and value for other events, leaving ids out', () => {
		expect(describeAuditDetail('member-removed', { memberId: 'abc', note: 'left the firm' })).toBe('note: left the firm');
	});
});
