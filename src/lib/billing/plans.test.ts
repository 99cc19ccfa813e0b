import { describe, expect, it } from 'vitest';
import { GRACE_DAYS, PLANS, effectivePlan, planAllows, plansWith, projectAllowance, seatLimit, type PlanStanding } from './plans';

const DAY_MS = 24 * 60 * 60 * 1000;
const now = new Date('2026-12-02T12:00:00Z');
const free: PlanStanding = { plan: 'free', planStatus: 'active', pastDueSince: null };
const team: PlanStanding = { plan: 'team', planStatus: 'active', pastDueSince: null };
const pastDue = (daysAgo: number): PlanStanding => ({ plan: 'team', planStatus: 'past_due', pastDueSince: new Date(now.getTime() - daysAgo * DAY_MS).toISOString() });
const lapsed: PlanStanding = { plan: 'team', planStatus: 'lapsed', pastDueSince: null };

describe('effectivePlan', () => {
	it('gives the subscribed plan while paid up, and free for a workspace that never paid', () => {
		expect(effectivePlan(team, now).plan.key).toBe('team');
		expect(effectivePlan(free, now)).toEqual({ plan: PLANS.free, lapsedFrom: null, graceEndsAt: null });
	});

	it(`keeps a past-due plan for ${GRACE_DAYS} days from the first failed renewal, then falls back to free`, () => {
		const inGrace = effectivePlan(pastDue(GRACE_DAYS - 1), now);
		expect(inGrace.plan.key).toBe('team');
		expect(inGrace.graceEndsAt?.getTime()).toBe(now.getTime() + DAY_MS);
		const beyond = effectivePlan(pastDue(GRACE_DAYS), now);
		expect(beyond.plan.key).toBe('free');
		expect(beyond.lapsedFrom?.key).toBe('team');
	});

	it('treats an unknown plan key as free rather than granting anything', () => {
		expect(effectivePlan({ plan: 'platinum', planStatus: 'active', pastDueSince: null }, now).plan.key).toBe('free');
	});
});

describe('planAllows', () => {
	it('refuses a paid feature on the free plan, naming the plans that have it', () => {
		const answer = planAllows(free, 'dataRooms', 'read', now);
		expect(answer).toEqual({ allowed: false, message: expect.stringContaining('need the Team or Practice plan') });
	});

	it('lets members read a lapsed plan’s feature, but refuses changes and investors until paid again', () => {
		expect(planAllows(lapsed, 'dataRooms', 'read', now).allowed).toBe(true);
		const change = planAllows(lapsed, 'dataRooms', 'change', now);
		expect(change.allowed).toBe(false);
		if (!change.allowed) expect(change.message).toMatch(/read-only.*Team plan is not paid.*nothing was deleted/);
		expect(planAllows(lapsed, 'probabilisticRuns', 'share', now).allowed).toBe(false);
		expect(planAllows(team, 'dataRooms', 'share', now).allowed).toBe(true);
	});

	it('keeps everything open during the grace period', () => {
		expect(planAllows(pastDue(1), 'dataRooms', 'share', now).allowed).toBe(true);
	});
});

describe('projectAllowance', () => {
	it('allows projects up to the plan’s limit and refuses the next with what to do', () => {
		expect(projectAllowance(free, PLANS.free.maxLiveProjects! - 1, now).allowed).toBe(true);
		const refused = projectAllowance(free, PLANS.free.maxLiveProjects!, now);
		expect(refused.allowed).toBe(false);
		if (!refused.allowed) expect(refused.message).toMatch(/Free plan has room for 3 live projects.*Archive a project/);
		expect(projectAllowance({ plan: 'practice', planStatus: 'active', pastDueSince: null }, 10_000, now).allowed).toBe(true);
	});

	it('applies the free limit to a lapsed paid plan and says why', () => {
		const refused = projectAllowance(lapsed, 5, now);
		expect(refused.allowed).toBe(false);
		if (!refused.allowed) expect(refused.message).toMatch(/Team plan is not paid.*nothing was deleted/);
	});
});

describe('seatLimit', () => {
	it('is the seats bought on a paid plan in good standing, the free plan’s otherwise', () => {
		expect(seatLimit(team, 7, now)).toBe(7);
		expect(seatLimit(free, null, now)).toBe(PLANS.free.includedSeats);
		expect(seatLimit(lapsed, 7, now)).toBe(PLANS.free.includedSeats);
	});
});

describe('plansWith', () => {
	it('lists the plans including a feature in words', () => {
		expect(plansWith('probabilisticRuns')).toBe('the Team or Practice plan');
	});
});
