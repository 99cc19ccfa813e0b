import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CAUTIONS } from '../../cautions';
import { parseScenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { summaryFileName, summaryMethodNotes, summaryNoteSlugs, teamCopyInput } from './summary-input';

describe('summaryMethodNotes', () => {
	it('gives each chosen note its title and markdown with its sources', () => {
		const notes = summaryMethodNotes('tidal-stream', false);
		expect(notes.map((n) => n.slug)).toEqual(summaryNoteSlugs('tidal-stream', false));
		for (const note of notes) expect(note.markdown, note.slug).toMatch(/^## Sources?$/m);
	});
});

describe('teamCopyInput', () => {
	it('is the team copy: no stamp, the cautions, the project row in the summary form', () => {
		const parsed = parseScenario(JSON.parse(readFileSync('examples/wave-orrin-bank.json', 'utf8')));
		if (!parsed.ok) throw new Error('the wave example should parse');
		const input = teamCopyInput({
			project: { name: 'Orrin Bank', technology: 'wave', site_name: 'Orrin Bank', site_description: 'Open shelf', currency: 'EUR' },
			scenario: { name: 'Base', revision: 2, notes: '' },
			document: parsed.scenario,
			result: evaluateScenario(parsed.scenario),
			engineVersion: '1',
			tornado: null,
			date: new Date('2026-01-02T03:04:05Z')
		});
		expect(input.stamp).toBeUndefined();
		expect(input.edition).toEqual({ label: 'Team copy', date: new Date('2026-01-02T03:04:05Z') });
		expect(input.cautions).toEqual(CAUTIONS);
		expect(input.project).toEqual({ name: 'Orrin Bank', technology: 'wave', siteName: 'Orrin Bank', siteDescription: 'Open shelf', currency: 'EUR' });
		expect(input.methodNotes.some((n) => n.slug === 'sensitivity')).toBe(false);
	});
});

describe('summaryFileName', () => {
	it('keeps safe characters only, with the revision', () => {
		expect(summaryFileName('Kestle Narrows: base case (P50) / "draft"', 3)).toBe('kestle-narrows-base-case-p50-draft-r3-summary.pdf');
		expect(summaryFileName('Ørsund ☂', 1)).toBe('rsund-r1-summary.pdf');
	});
});
