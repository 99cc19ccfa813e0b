/**
 * The plans: the one table of what each plan allows, read through the
 * caller's membership (which carries its workspace's plan and standing).
 * Prices are not here: they live in the seed data (table plan_prices) and in
 * Stripe, found by lookup key. Plain data and pure functions, safe in the browser.
 */

export const PLAN_KEYS = ['free', 'team', 'practice'] as const;
export type PlanKey = (typeof PLAN_KEYS)[number];
export type PaidPlanKey = Exclude<PlanKey, 'free'>;
export const PAID_PLAN_KEYS = ['team', 'practice'] as const satisfies readonly PaidPlanKey[];

/** What a plan can switch on; the later features (data rooms, probabilistic runs) ask the same question. */
export type PlanFeature = 'dataRooms' | 'probabilisticRuns';

export interface PlanDefinition {
	key: PlanKey;
	name: string;
	summary: string;
	/** Seats (owners and analysts) a free workspace has without paying; null on paid plans: the seats bought. */
	includedSeats: number | null;
	minSeats: number;
	maxSeats: number;
	/** Live (not archived) projects in one workspace; null: no limit. */
	maxLiveProjects: number | null;
	features: Record<PlanFeature, boolean>;
}

export const PLANS: Record<PlanKey, PlanDefinition> = {
	free: {
		key: 'free',
		name: 'Free',
		summary: 'One workspace of your own, two seats, three live projects; no data rooms, no probabilistic runs.',
		includedSeats: 2,
		minSeats: 0,
		maxSeats: 2,
		maxLiveProjects: 3,
		features: { dataRooms: false, probabilisticRuns: false }
	},
	team: {
		key: 'team',
		name: 'Team',
		summary: "A developer's team: paid per seat, up to 40 live projects, investor data rooms and probabilistic runs.",
		includedSeats: null,
		minSeats: 1,
		maxSeats: 200,
		maxLiveProjects: 40,
		features: { dataRooms: true, probabilisticRuns: true }
	},
	practice: {
		key: 'practice',
		name: 'Practice',
		summary: 'For consultants with many client projects: paid per seat, no project limit, data rooms and probabilistic runs.',
		includedSeats: null,
		minSeats: 2,
		maxSeats: 500,
		maxLiveProjects: null,
		features: { dataRooms: true, probabilisticRuns: true }
	}
};

export const FEATURE_NAMES: Record<PlanFeature, string> = {
	dataRooms: 'Investor data rooms',
	probabilisticRuns: 'Probabilistic runs'
};

export function isPlanKey(value: unknown): value is PlanKey {
	return typeof value === 'string' && (PLAN_KEYS as readonly string[]).includes(value);
}

export function isPaidPlanKey(value: unknown): value is PaidPlanKey {
	return typeof value === 'string' && (PAID_PLAN_KEYS as readonly string[]).includes(value);
}

/**
 * Where a workspace stands with its plan, as billing last wrote it:
 * active (paid up, or never paid: free), past_due (a renewal failed; the plan
 * holds for a grace period) or lapsed (cancelled, or unpaid beyond grace).
 */
export type PlanStatus = 'active' | 'past_due' | 'lapsed';

export interface PlanStanding {
	/** The plan subscribed to ('free' when none ever was). */
	plan: string;
	planStatus: PlanStatus;
	/** When a renewal first failed (ISO), while past due. */
	pastDueSince: string | null;
}

export const GRACE_DAYS = 7;
const DAY_MS = 24 * 60 * 60 * 1000;

export interface EffectivePlan {
	/** The plan whose limits apply now. */
	plan: PlanDefinition;
	/** The paid plan that lapsed, when one did: its features are read-only and closed to investors. */
	lapsedFrom: PlanDefinition | null;
	/** While a failed renewal is in its grace period: when the grace ends. */
	graceEndsAt: Date | null;
}

export function effectivePlan(standing: PlanStanding, now: Date = new Date()): EffectivePlan {
	const subscribed = isPlanKey(standing.plan) ? PLANS[standing.plan] : PLANS.free;
	if (subscribed.key === 'free') return { plan: PLANS.free, lapsedFrom: null, graceEndsAt: null };
	if (standing.planStatus === 'lapsed') return { plan: PLANS.free, lapsedFrom: subscribed, graceEndsAt: null };
	if (standing.planStatus === 'past_due') {
		const since = standing.pastDueSince ? new Date(standing.pastDueSince).getTime() : now.getTime();
		const graceEndsAt = new Date(since + GRACE_DAYS * DAY_MS);
		if (now.getTime() >= graceEndsAt.getTime()) return { plan: PLANS.free, lapsedFrom: subscribed, graceEndsAt: null };
		return { plan: subscribed, lapsedFrom: null, graceEndsAt };
	}
	return { plan: subscribed, lapsedFrom: null, graceEndsAt: null };
}

/** The paid plans that include a feature, in words: "the Team or Practice plan". */
export function plansWith(feature: PlanFeature): string {
	const names = PLAN_KEYS.filter((k) => PLANS[k].features[feature]).map((k) => PLANS[k].name);
	const list = names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`;
	return `the ${list} plan`;
}

/** How a feature is being used: reading what exists, changing it, or showing it to investors. */
export type FeatureUse = 'read' | 'change' | 'share';

export type PlanAnswer = { allowed: true } | { allowed: false; message: string };

/**
 * Whether the workspace's plan allows a feature for a use. A lapsed paid plan
 * keeps what was made readable by members (nothing is deleted) but refuses
 * changes and closes it to investors until the plan is paid again.
 */
export function planAllows(standing: PlanStanding, feature: PlanFeature, use: FeatureUse, now: Date = new Date()): PlanAnswer {
	const effective = effectivePlan(standing, now);
	if (effective.plan.features[feature]) return { allowed: true };
	const name = FEATURE_NAMES[feature];
	if (effective.lapsedFrom?.features[feature]) {
		if (use === 'read') return { allowed: true };
		return {
			allowed: false,
			message: `${name} are read-only while this workspace's ${effective.lapsedFrom.name} plan is not paid: nothing was deleted, and paying again reopens them. An owner can do that on the billing page.`
		};
	}
	return { allowed: false, message: `${name} need ${plansWith(feature)}. An owner can upgrade this workspace on the billing page.` };
}

/** Whether one more live project fits the plan. */
export function projectAllowance(standing: PlanStanding, liveProjects: number, now: Date = new Date()): PlanAnswer {
	const { plan, lapsedFrom } = effectivePlan(standing, now);
	if (plan.maxLiveProjects === null || liveProjects < plan.maxLiveProjects) return { allowed: true };
	const why = lapsedFrom
		? `This workspace's ${lapsedFrom.name} plan is not paid, so the ${plan.name} plan's limit of ${plan.maxLiveProjects} live projects applies (nothing was deleted)`
		: `The ${plan.name} plan has room for ${plan.maxLiveProjects} live projects`;
	return { allowed: false, message: `${why}. Archive a project, or an owner can upgrade on the billing page.` };
}

/** Seats available: what was bought on a paid plan in good standing, else the free plan's. */
export function seatLimit(standing: PlanStanding, paidSeats: number | null, now: Date = new Date()): number {
	const { plan } = effectivePlan(standing, now);
	return plan.includedSeats ?? paidSeats ?? 0;
}
