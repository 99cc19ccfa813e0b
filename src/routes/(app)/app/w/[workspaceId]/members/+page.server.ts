import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { inviteForm } from '$lib/schemas/account';
import type { RequestEvent } from '@sveltejs/kit';
import { authorize, type WorkspaceAccess } from '$lib/server/auth/access';
import { isWorkspaceRole, roleDescriptions } from '$lib/server/auth/roles';
import { LastOwnerError, changeMemberRole, getMember, listMembers, removeMember, type MemberRow } from '$lib/server/db/memberships';
import { takeInvitationAllowance } from '$lib/server/auth/mail-limits';
import { waitInWords } from '$lib/server/auth/rate-limit';
import { INVITATION_DAYS, createInvitation, listOpenInvitations, revokeInvitation } from '$lib/server/db/invitations';
import { recordAuditEvent, type AuditEventName } from '$lib/server/db/audit';
import { getUserById } from '$lib/server/db/users';
import { SeatLimitError, billingPath, seatHolders, seatsUsed } from '$lib/server/billing/gates';
import { getBillingAccount } from '$lib/server/db/billing';
import { effectivePlan, seatLimit } from '$lib/billing/plans';
import { sendMail } from '$lib/server/mail/mailer';
import { invitationMessage } from '$lib/server/mail/templates';
import { fieldErrors, readForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { user, membership } = await authorize(event, event.params, 'viewer');
	const isOwner = membership.role === 'owner';
	const [members, invitations, holders, account] = await Promise.all([
		listMembers(membership.workspaceId),
		isOwner ? listOpenInvitations(membership.workspaceId) : Promise.resolve([]),
		seatHolders(membership.workspaceId),
		getBillingAccount(membership.workspaceId)
	]);
	return {
		me: user.id,
		isOwner,
		roleDescriptions,
		seats: {
			used: seatsUsed(holders),
			limit: seatLimit(membership, account?.seats ?? null),
			planName: effectivePlan(membership).plan.name,
			billingUrl: billingPath(membership.workspaceId)
		},
		members: members.map((m) => ({ userId: m.userId, email: m.email, name: m.name, role: m.role })),
		invitations: invitations.map((i) => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt.toISOString() }))
	};
};

const memberTarget = z.object({ userId: z.string().uuid('Choose a member.') });
const notAMember = 'That person is not a member of this workspace (any more): nothing was changed.';

/** The member acted on, by name and address as they are now: what the audit log keeps. */
const memberDetail = (member: MemberRow) => ({ memberId: member.userId, memberName: member.name, memberEmail: member.email });

/** Records a workspace event done by the signed-in owner or member. */
function audit(event: RequestEvent, access: Pick<WorkspaceAccess, 'user' | 'membership'>, name: AuditEventName, detail?: Record<string, unknown>) {
	return recordAuditEvent({
		event: name,
		workspaceId: access.membership.workspaceId,
		actorUserId: access.user.id,
		actorEmail: access.user.email,
		ip: event.getClientAddress(),
		detail
	});
}

export const actions: Actions = {
	invite: async (event) => {
		const { user, membership } = await authorize(event, event.params, 'owner');
		const fields = await readForm(event.request);
		const parsed = inviteForm.safeParse(fields);
		if (!parsed.success) {
			return fail(400, { action: 'invite', email: fields.email ?? '', role: fields.role ?? 'analyst', errors: fieldErrors(parsed.error) });
		}
		const allowance = await takeInvitationAllowance(membership.workspaceId);
		if (!allowance.allowed) {
			const message = `This workspace sent 20 invitations in the last hour. Try again in ${waitInWords(allowance.retryAfterSeconds)}.`;
			return fail(429, { action: 'invite', email: parsed.data.email, role: parsed.data.role, errors: { email: message } as Record<string, string> });
		}
		let invitation: { id: string; token: string };
		try {
			invitation = await createInvitation({ workspaceId: membership.workspaceId, email: parsed.data.email, role: parsed.data.role, invitedBy: user.id });
		} catch (error) {
			if (!(error instanceof SeatLimitError)) throw error;
			return fail(402, {
				action: 'invite',
				email: parsed.data.email,
				role: parsed.data.role,
				errors: { role: error.message } as Record<string, string>,
				billingUrl: billingPath(membership.workspaceId)
			});
		}
		const { id, token } = invitation;
		const inviter = await getUserById(user.id);
		await sendMail(
			parsed.data.email,
			invitationMessage({
				inviterName: inviter?.name || user.email,
				workspaceName: membership.workspaceName,
				role: parsed.data.role,
				url: `${event.url.origin}/invite/${token}`,
				daysValid: INVITATION_DAYS
			})
		);
		await audit(event, { user, membership }, 'invitation-sent', { invitationId: id, email: parsed.data.email, role: parsed.data.role });
		return { action: 'invite', sentTo: parsed.data.email, email: '', role: 'analyst', errors: {} as Record<string, string> };
	},

	changeRole: async (event) => {
		const { user, membership } = await authorize(event, event.params, 'owner');
		const fields = await readForm(event.request);
		const target = memberTarget.safeParse(fields);
		if (!target.success || !isWorkspaceRole(fields.role)) return fail(400, { action: 'changeRole', tone: 'error' as const, message: 'Choose a member and a role.' });
		const member = await getMember(membership.workspaceId, target.data.userId);
		if (!member) return fail(404, { action: 'changeRole', tone: 'error' as const, message: notAMember });
		try {
			const previous = await changeMemberRole(membership.workspaceId, target.data.userId, fields.role);
			if (!previous) return fail(404, { action: 'changeRole', tone: 'error' as const, message: notAMember });
			await audit(event, { user, membership }, 'role-changed', { ...memberDetail(member), from: previous, to: fields.role });
		} catch (error) {
			if (error instanceof LastOwnerError) return fail(409, { action: 'changeRole', tone: 'error' as const, message: error.message });
			if (error instanceof SeatLimitError) {
				return fail(402, { action: 'changeRole', tone: 'error' as const, message: error.message, billingUrl: billingPath(membership.workspaceId) });
			}
			throw error;
		}
		return { action: 'changeRole', tone: 'ok' as const, message: 'Role changed.' };
	},

	/** Asks first: without `confirmed=yes` the answer is the question, naming the person, and nothing changes. */
	remove: async (event) => {
		const { user, membership } = await authorize(event, event.params, 'owner');
		const fields = await readForm(event.request);
		const target = memberTarget.safeParse(fields);
		if (!target.success) return fail(400, { action: 'remove', tone: 'error' as const, message: 'Choose a member.' });
		const member = await getMember(membership.workspaceId, target.data.userId);
		if (!member) return fail(404, { action: 'remove', tone: 'error' as const, message: notAMember });
		if (fields.confirmed !== 'yes') {
			return { action: 'remove', confirmRemove: { userId: member.userId, name: member.name, email: member.email, role: member.role } };
		}
		try {
			const removed = await removeMember(membership.workspaceId, target.data.userId);
			if (!removed) return fail(404, { action: 'remove', tone: 'error' as const, message: notAMember });
		} catch (error) {
			if (error instanceof LastOwnerError) return fail(409, { action: 'remove', tone: 'error' as const, message: error.message });
			throw error;
		}
		await audit(event, { user, membership }, 'member-removed', { ...memberDetail(member), role: member.role });
		return { action: 'remove', tone: 'ok' as const, message: `${member.name || member.email} is no longer a member of ${membership.workspaceName}.` };
	},

	revoke: async (event) => {
		const { user, membership } = await authorize(event, event.params, 'owner');
		const invitationId = (await readForm(event.request)).invitationId ?? '';
		if (!z.string().uuid().safeParse(invitationId).success || !(await revokeInvitation(membership.workspaceId, invitationId))) {
			return fail(404, { action: 'revoke', tone: 'error' as const, message: 'That invitation is no longer open.' });
		}
		await audit(event, { user, membership }, 'invitation-revoked', { invitationId });
		return { action: 'revoke', tone: 'ok' as const, message: 'Invitation withdrawn.' };
	},

	leave: async (event) => {
		const { user, membership } = await authorize(event, event.params, 'viewer');
		try {
			await removeMember(membership.workspaceId, user.id);
		} catch (error) {
			if (error instanceof LastOwnerError) return fail(409, { action: 'leave', tone: 'error' as const, message: error.message });
			throw error;
		}
		await audit(event, { user, membership }, 'member-left');
		redirect(303, '/app');
	}
};
