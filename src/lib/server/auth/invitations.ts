import { acceptInvitation, getInvitationByToken, type InvitationView } from '../db/invitations';
import { recordAuditEvent } from '../db/audit';
import { setSessionWorkspace, type SessionUser } from './session';

export type AcceptOutcome = { ok: true; invitation: InvitationView } | { ok: false; message: string };

const statusWords: Record<Exclude<InvitationView['status'], 'open'>, string> = {
	accepted: 'This invitation has already been accepted.',
	revoked: 'This invitation was withdrawn by the workspace owner.',
	expired: 'This invitation has expired. Ask the owner for a new one.'
};

export function invitationProblem(invitation: InvitationView | undefined): string | null {
	if (!invitation) return 'This invitation link is not valid.';
	return invitation.status === 'open' ? null : statusWords[invitation.status];
}

/** The invited address must be the accepting account's: the link alone does not grant access to someone else. */
export async function acceptInvitationAs(token: string, user: SessionUser, sessionId: string, ip: string): Promise<AcceptOutcome> {
	const invitation = await getInvitationByToken(token);
	const problem = invitationProblem(invitation);
	if (problem) return { ok: false, message: problem };
	if (invitation!.email.toLowerCase() !== user.email.toLowerCase()) {
		return {
			ok: false,
			message: `This invitation was sent to ${invitation!.email}. Sign in with that address to accept it.`
		};
	}
	const accepted = await acceptInvitation(token, user.id);
	if (!accepted) return { ok: false, message: 'This invitation is no longer open.' };
	await setSessionWorkspace(sessionId, accepted.workspaceId);
	await recordAuditEvent({
		event: 'invitation-accepted',
		workspaceId: accepted.workspaceId,
		actorUserId: user.id,
		actorEmail: user.email,
		ip,
		detail: { role: accepted.role }
	});
	return { ok: true, invitation: accepted };
}
