import { describe, expect, it } from 'vitest';
import { METHOD_NOTES } from '../../methods';
import { METRIC_LIST } from '../../metrics/catalogue';
import { summaryNoteSlugs } from './note-choice';

describe('summaryNoteSlugs', () => {
	it('prints the note of every metric, the power note of the technology only, and sensitivity only with a tornado', () => {
		const tidal = summaryNoteSlugs('tidal-stream', false);
		for (const metric of METRIC_LIST) expect(tidal).toContain(metric.method);
		expect(tidal).toContain('current-power');
		expect(tidal).not.toContain('wave-power');
		expect(tidal).not.toContain('sensitivity');
		expect(summaryNoteSlugs('wave', true)).toContain('wave-power');
		expect(summaryNoteSlugs('wave', true)).not.toContain('current-power');
		expect(summaryNoteSlugs('wave', true)).toContain('sensitivity');
	});

	it('prints the probabilistic-runs note only beside a run', () => {
		expect(summaryNoteSlugs('wave', true)).not.toContain('probabilistic-runs');
		expect(summaryNoteSlugs('wave', false, true)).toContain('probabilistic-runs');
	});

	it('keeps the reading order of the notes', () => {
		const order = METHOD_NOTES.map((n) => n.slug as string);
		const slugs = summaryNoteSlugs('ocean-current', true);
		expect([...slugs].sort((a, b) => order.indexOf(a) - order.indexOf(b))).toEqual(slugs);
		expect(slugs[0]).toBe('time-convention');
	});
});
