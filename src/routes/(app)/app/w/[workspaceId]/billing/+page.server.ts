import { fail, redirect, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { authorize, requireBrowserSession } from '$lib/server/auth/access';
import { billingSettings } from '$lib/server/settings';
import { getBillingAccount, getWorkspaceStanding, listInvoices, listPlanPrices } from '$lib/server/db/billing';
import { holderNames, seatHolders, seatsUsed } from '$lib/server/billing/gates';
import {
	BillingProblem,
	changeSeats,
	completeCheckout,
	portalUrl,
	previewSeatChange,
	setCancelAtPeriodEnd,
	startCheckout
} from '$lib/server/billing/subscription';
import { recordAuditEvent } from '$lib/server/db/audit';
import { readForm } from '$lib/server/forms';
import { PAID_PLAN_KEYS, PLANS, effectivePlan, seatLimit } from '$lib/billing/plans';
import type { Actions, PageServerLoad } from './$types';

/** Billing is the owners' business, in the browser only (never with an API token). */
async function ownerAccess(event: RequestEvent) {
	requireBrowserSession(event);
	return authorize(event, event.params as { workspaceId: string }, 'owner');
}

export const load: PageServerLoad = async (event) => {
	const { membership } = await ownerAccess(event);
	const settings = billingSettings();
	const workspaceId = membership.workspaceId;
	let checkoutNote: string | null = null;
	const checkout = event.url.searchParams.get('checkout');
	if (checkout === 'cancelled') checkoutNote = 'Checkout was cancelled: nothing was charged and the plan is unchanged.';
	else if (checkout && settings.enabled && /^cs_\w+$/.test(checkout)) {
		checkoutNote = (await completeCheckout(workspaceId, checkout))
			? 'Thank you: the plan is paid and its features are open.'
			: 'The payment is not finished yet: this page will show the plan once Stripe confirms it.';
	}
	// Read after the checkout above, which may have just changed them.
	const [account, invoices, prices, holders, standing] = await Promise.all([
		getBillingAccount(workspaceId),
		listInvoices(workspaceId),
		listPlanPrices(),
		seatHolders(workspaceId),
		getWorkspaceStanding(workspaceId)
	]);
	const effective = effectivePlan(standing);
	return {
		enabled: settings.enabled,
		testMode: settings.testMode,
		checkoutNote,
		plan: {
			key: effective.plan.key,
			name: effective.plan.name,
			summary: effective.plan.summary,
			lapsedFrom: effective.lapsedFrom?.name ?? null,
			graceEndsAt: effective.graceEndsAt?.toISOString() ?? null,
			status: standing.planStatus
		},
		subscription: account?.subscriptionId
			? {
					status: account.subscriptionStatus,
					seats: account.seats,
					currentPeriodEnd: account.currentPeriodEnd?.toISOString() ?? null,
					cancelAtPeriodEnd: account.cancelAtPeriodEnd,
					priceLookupKey: account.priceLookupKey,
					live: account.subscriptionStatus !== 'canceled' && account.subscriptionStatus !== 'incomplete_expired'
				}
			: null,
		hasCustomer: account !== undefined,
		seats: { used: seatsUsed(holders), limit: seatLimit(standing, account?.seats ?? null), holders: holderNames(holders) },
		offers: prices.map((p) => ({ ...p, planName: PLANS[p.plan].name, summary: PLANS[p.plan].summary, minSeats: PLANS[p.plan].minSeats, maxSeats: PLANS[p.plan].maxSeats })),
		invoices: invoices.map((i) => ({
			id: i.id,
			number: i.number,
			status: i.status,
			amountDue: i.amountDue,
			amountPaid: i.amountPaid,
			currency: i.currency,
			periodStart: i.periodStart?.toISOString() ?? null,
			periodEnd: i.periodEnd?.toISOString() ?? null,
			issuedAt: i.issuedAt.toISOString(),
			hostedUrl: i.hostedUrl
		}))
	};
};

const seatsField = z.coerce.number({ message: 'Give the number of seats.' }).int('Seats are whole people.').min(1, 'At least one seat.');
const upgradeForm = z.object({ plan: z.enum(PAID_PLAN_KEYS, { message: 'Choose a plan.' }), seats: seatsField });
const seatsForm = z.object({ seats: seatsField });

function refusal(action: string, e: unknown) {
	if (e instanceof BillingProblem) return fail(e.field === 'seats' ? 400 : 409, { action, field: e.field, message: e.message });
	throw e;
}

async function audit(event: RequestEvent, workspaceId: string, detail: Record<string, unknown>) {
	const user = event.locals.user!;
	await recordAuditEvent({ event: 'billing-changed', workspaceId, actorUserId: user.id, actorEmail: user.email, ip: event.getClientAddress(), detail });
}

export const actions: Actions = {
	upgrade: async (event) => {
		const { membership, user } = await ownerAccess(event);
		const parsed = upgradeForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'upgrade', field: String(parsed.error.issues[0].path[0]), message: parsed.error.issues[0].message });
		let url: string;
		try {
			url = await startCheckout({
				workspace: { id: membership.workspaceId, name: membership.workspaceName },
				owner: { email: user.email, name: user.name },
				plan: parsed.data.plan,
				seats: parsed.data.seats,
				origin: event.url.origin
			});
		} catch (e) {
			return refusal('upgrade', e);
		}
		redirect(303, url);
	},

	previewSeats: async (event) => {
		const { membership } = await ownerAccess(event);
		const parsed = seatsForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'seats', field: 'seats', message: parsed.error.issues[0].message });
		try {
			const preview = await previewSeatChange(membership.workspaceId, parsed.data.seats);
			return { action: 'seats', preview: { ...preview, nextRenewal: preview.nextRenewal?.toISOString() ?? null } };
		} catch (e) {
			return refusal('seats', e);
		}
	},

	changeSeats: async (event) => {
		const { membership } = await ownerAccess(event);
		const parsed = seatsForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'seats', field: 'seats', message: parsed.error.issues[0].message });
		try {
			await changeSeats(membership.workspaceId, parsed.data.seats);
		} catch (e) {
			return refusal('seats', e);
		}
		await audit(event, membership.workspaceId, { change: 'seats', seats: parsed.data.seats });
		return { action: 'seats', done: `Seats changed to ${parsed.data.seats}.` };
	},

	cancel: async (event) => {
		const { membership } = await ownerAccess(event);
		try {
			await setCancelAtPeriodEnd(membership.workspaceId, true);
		} catch (e) {
			return refusal('cancel', e);
		}
		await audit(event, membership.workspaceId, { change: 'cancel-at-period-end' });
		return { action: 'cancel', done: 'The plan ends at the close of this period; you can resume it until then.' };
	},

	resume: async (event) => {
		const { membership } = await ownerAccess(event);
		try {
			await setCancelAtPeriodEnd(membership.workspaceId, false);
		} catch (e) {
			return refusal('resume', e);
		}
		await audit(event, membership.workspaceId, { change: 'resume' });
		return { action: 'resume', done: 'The plan continues and renews as before.' };
	},

	portal: async (event) => {
		const { membership } = await ownerAccess(event);
		let url: string;
		try {
			url = await portalUrl(membership.workspaceId, `${event.url.origin}/app/w/${membership.workspaceId}/billing`);
		} catch (e) {
			return refusal('portal', e);
		}
		redirect(303, url);
	}
};
