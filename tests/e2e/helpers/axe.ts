/**
 * axe-core's WCAG 2.0 and 2.1 rules, levels A and AA, over a page as it
 * stands, and the findings the browser tests refuse: those axe rates serious
 * or critical, one line each with the rule, its impact and the element.
 */
import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';

export const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

/**
 * The app has no frames, so axe runs once in the page itself ("legacy mode": no blank page opened to combine
 * frames' results) and reports violations only: together about twice as fast as the defaults here.
 */
export async function graveAxeFindings(page: Page): Promise<string[]> {
	const results = await new AxeBuilder({ page }).withTags(WCAG_TAGS).options({ resultTypes: ['violations'] }).setLegacyMode(true).analyze();
	return results.violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.flatMap((v) => v.nodes.map((n) => `${v.id} (${v.impact}): ${n.target.join(' ')} — ${(n.failureSummary ?? '').split('\n').slice(1).join(' ').trim()}`));
}
