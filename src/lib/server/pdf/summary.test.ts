import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAUTIONS } from '../../cautions';
import { METRIC_LIST } from '../../metrics/catalogue';
import { coverShortfallsText } from '../../metrics/cover-shortfalls';
import { formatMetric } from '../../metrics/format';
import { parseScenario, type Scenario } from '../../schemas/scenario';
import { evaluateScenario } from '../engine/evaluate';
import { defaultDrivers, tornado } from '../engine/sensitivity';
import { CHAPTERS, renderScenarioSummaryPdf, type ScenarioSummaryInput } from './summary';
import { summaryMethodNotes } from './summary-input';
import { P90_CONVENTION, runProbabilities } from '../../probabilistic/run-report';
import type { SnapshotRun } from '../rooms/snapshot-format';
import { handMadeInput, handMadeSummary } from '../../../../tests/fixtures/probabilistic-run';

// The PDF is read back with poppler's pdftotext and pdfimages (Debian's poppler-utils), as a reader's tools would.
const EXAMPLES = ['tidal-stream-kestle-narrows', 'ocean-current-mornstrand', 'wave-orrin-bank'] as const;
const STAMP = { email: 'ines.marlowe@corvane.example', at: new Date('2026-03-14T09:05:00Z') };
/** The unit line under the cash-flow table's first header: printed once in each header row, nowhere else. */
const CASH_FLOW_HEADER = 't, 0 = COD';

let folder: string;

function example(name: string, operatingYears?: number, change?: (raw: { timeline: Record<string, unknown>; finance: Record<string, unknown> }) => void): Scenario {
	const raw = JSON.parse(readFileSync(`examples/${name}.json`, 'utf8'));
	if (operatingYears !== undefined) raw.timeline.operatingYears = operatingYears;
	change?.(raw);
	const parsed = parseScenario(raw);
	if (!parsed.ok) throw new Error(`examples/${name}.json should parse: ${JSON.stringify(parsed.issues)}`);
	return parsed.scenario;
}

function inputFor(document: Scenario, options: { stamp?: boolean; tornado?: boolean } = {}): ScenarioSummaryInput {
	const result = evaluateScenario(document);
	const withTornado = options.tornado ?? true;
	return {
		project: { name: `Halvard Marine Energy: ${document.site.name}`, technology: document.technology, siteName: document.site.name ?? '', siteDescription: 'An invented channel between two invented headlands.', currency: document.currency },
		scenario: { name: document.name, revision: 4, notes: 'Lender base case.' },
		document,
		result,
		engineVersion: '1',
		tornado: withTornado ? tornado(document, defaultDrivers(document), 'lcoeReal') : null,
		methodNotes: summaryMethodNotes(document.technology, withTornado),
		cautions: CAUTIONS,
		edition: { label: 'Data room Kestle Narrows, version 3', date: new Date('2026-03-14T09:00:00Z') },
		stamp: options.stamp === false ? undefined : STAMP
	};
}

interface ReadBack {
	pages: string[];
	/** Each page's text with runs of white space as one space (lines wrap anywhere). */
	flat: string[];
	imageCount: number;
}

let counter = 0;
async function renderAndRead(input: ScenarioSummaryInput): Promise<ReadBack> {
	const pdf = await renderScenarioSummaryPdf(input);
	const file = join(folder, `summary-${++counter}.pdf`);
	writeFileSync(file, pdf);
	const text = execFileSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
	// pdftotext ends every page with a form feed.
	const pages = text.split('\f').slice(0, -1);
	const images = execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' }).trim().split('\n').slice(2);
	return { pages, flat: pages.map((p) => p.replace(/\s+/g, ' ')), imageCount: images.filter((line) => line.trim() !== '').length };
}

const occurrences = (text: string, part: string) => text.split(part).length - 1;

beforeAll(() => {
	folder = mkdtempSync(join(tmpdir(), 'tidewright-pdf-'));
});
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('renderScenarioSummaryPdf', () => {
	for (const name of EXAMPLES) {
		describe(name, () => {
			let input: ScenarioSummaryInput;
			let read: ReadBack;
			beforeAll(async () => {
				input = inputFor(example(name));
				read = await renderAndRead(input);
			});

			it('has a cover and more pages after it', () => {
				expect(read.pages.length).toBeGreaterThan(1);
				expect(read.flat[0]).toContain(input.project.name);
				expect(read.flat[0]).toContain(`${input.scenario.name}, revision 4`);
				expect(read.flat[0]).toContain('Data room Kestle Narrows, version 3');
				expect(read.flat[0]).toContain('14 March 2026');
			});

			it("prints every catalogue metric's label and value exactly as the app formats them", () => {
				const metricsPage = read.flat.find((page) => page.includes(CHAPTERS.metrics))!;
				for (const metric of METRIC_LIST) {
					expect(metricsPage, metric.key).toContain(metric.label);
					expect(metricsPage, metric.key).toContain(formatMetric(metric.key, input.result.metrics[metric.key]));
				}
			});

			it('repeats the cash-flow header once on every page of the table and lists every year', () => {
				const tablePages = read.flat.filter((page) => page.includes(CHAPTERS.cashFlow));
				expect(tablePages.length).toBeGreaterThan(0);
				for (const page of tablePages) expect(occurrences(page, CASH_FLOW_HEADER)).toBe(1);
				expect(occurrences(read.flat.join(' '), CASH_FLOW_HEADER)).toBe(tablePages.length);
				expect(occurrences(tablePages.join(' '), ' build ')).toBe(input.document.timeline.constructionYears);
			});

			it('carries the cautions, the page count and the stamp on every page', () => {
				read.flat.forEach((page, i) => {
					for (const caution of CAUTIONS) expect(page, `page ${i + 1}`).toContain(caution);
					expect(page, `page ${i + 1}`).toContain(`Page ${i + 1} of ${read.pages.length}`);
					expect(page, `page ${i + 1}`).toContain(`Prepared for ${STAMP.email} on 2026-03-14 09:05 UTC`);
				});
			});

			it('puts the project and scenario in the header of every page after the cover', () => {
				read.flat.slice(1).forEach((page, i) => {
					expect(page, `page ${i + 2}`).toContain(input.project.name);
					expect(page, `page ${i + 2}`).toContain(`${input.scenario.name} (revision 4)`);
				});
			});

			it('draws its charts as vectors: the file holds no picture', () => {
				expect(read.flat.join(' ')).toContain('Gross array energy');
				expect(read.flat.join(' ')).toContain('Tornado: LCOE, real');
				expect(read.imageCount).toBe(0);
			});

			it('prints each method note with its sources', () => {
				const notes = read.flat.slice(read.flat.findIndex((page) => page.includes(CHAPTERS.notes))).join(' ');
				for (const note of input.methodNotes) expect(notes, note.slug).toContain(note.title);
				// Every note ends with its "Sources" (or "Source") section.
				expect(occurrences(notes, 'Source')).toBeGreaterThanOrEqual(input.methodNotes.length);
			});
		});
	}

	describe('a 30-year case', () => {
		let read: ReadBack;
		beforeAll(async () => {
			read = await renderAndRead(inputFor(example('tidal-stream-kestle-narrows', 30)));
		});

		it('runs the cash-flow table over more than one page, the header repeated on each', () => {
			const tablePages = read.flat.filter((page) => page.includes(CHAPTERS.cashFlow));
			expect(tablePages.length).toBeGreaterThan(1);
			expect(tablePages.slice(1).every((page) => page.includes(`${CHAPTERS.cashFlow} (continued)`))).toBe(true);
			for (const page of tablePages) expect(occurrences(page, CASH_FLOW_HEADER)).toBe(1);
		});
	});

	describe('a geared loan whose cover falls short in some years', () => {
		let input: ScenarioSummaryInput;
		let read: ReadBack;
		beforeAll(async () => {
			// 90 % gearing on an annuity leaves several years with CFADS below the debt service (checked below).
			const geared = example('tidal-stream-kestle-narrows', undefined, (raw) => {
				raw.finance.debt = { sizing: 'gearing', gearing: 0.9, interestRate: 0.065, tenorYears: 15, graceYears: 1, repayment: 'annuity' };
			});
			input = inputFor(geared, { tornado: false });
			read = await renderAndRead(input);
		});

		it('names the years beside the minimum DSCR on the metrics page', () => {
			const text = coverShortfallsText(input.result.coverShortfalls);
			expect(text).toMatch(/^DSCR below 1 in operating years? /);
			const metricsPage = read.flat.find((page) => page.includes(CHAPTERS.metrics))!;
			expect(metricsPage).toContain(`Minimum DSCR: ${text}.`);
		});
	});

	describe('a loan also sized on downside energy, spent quarterly and funded pro rata', () => {
		let read: ReadBack;
		beforeAll(async () => {
			const lender = example('tidal-stream-kestle-narrows', undefined, (raw) => {
				raw.timeline.spendTiming = 'quarterly';
				Object.assign(raw.finance.debt as object, {
					commitmentFee: 0.005,
					fundingOrder: 'pro-rata',
					downsideCases: [{ exceedancePercent: 90, targetDscr: 1.2 }]
				});
			});
			read = await renderAndRead(inputFor(lender, { tornado: false }));
		});

		it('prints the spend timing, the funding order, the energy cases and the debt each allows', () => {
			const all = read.flat.join(' ');
			expect(all).toContain('Quarterly, in the middle of each quarter');
			expect(all).toContain('Debt and equity in step (pro rata)');
			expect(all).toContain('Energy cases the debt is sized on');
			expect(all).toContain('Debt each sizing case allows');
			expect(all).toMatch(/Sized by the P(50|90) target DSCR/);
		});

		it('draws the DSCR of the downside case with its own target in the chart legend', () => {
			expect(read.flat.join(' ')).toContain('P90 DSCR (target 1.20×)');
			expect(read.flat.join(' ')).toContain('P50 DSCR');
		});

		it('has the financing fees in the cash-flow table', () => {
			const tablePages = read.flat.filter((page) => page.includes(CHAPTERS.cashFlow));
			expect(tablePages[0]).toContain('Fees');
		});
	});

	describe('a summary with a probabilistic run', () => {
		let read: ReadBack;
		let runPage: string;
		beforeAll(async () => {
			const input = handMadeInput();
			const run: SnapshotRun = {
				runId: '00000000-0000-4000-8000-000000000001',
				seed: input.seed,
				draws: input.draws,
				engineVersion: '7',
				finishedAt: '2026-12-08T10:30:00.000Z',
				drivers: [
					{ driver: 'capex', label: 'Capex', unit: 'x base', distribution: input.drivers[0].distribution },
					{ driver: 'opex', label: 'Opex', unit: 'x base', distribution: input.drivers[1].distribution }
				],
				correlations: input.correlations,
				energyUncertainty: true,
				hurdleRate: input.hurdleRate,
				summary: handMadeSummary()
			};
			const document = example('tidal-stream-kestle-narrows');
			read = await renderAndRead({ ...inputFor(document, { tornado: false }), run, methodNotes: summaryMethodNotes(document.technology, false, true) });
			runPage = read.flat.filter((page) => page.includes(CHAPTERS.run) && page.includes('Mean')).join(' ');
		});

		it('prints the run on a page of its own: the table of mean, P90, P50 and P10 with the words on the P90 convention', () => {
			expect(runPage).toContain('100 draws, seed 4242, engine 7, finished 8 December 2026');
			// Equity IRR of the hand-made run, worked by hand in tests/fixtures/probabilistic-run.ts: mean 9.50, P90 5.90, P50 9.50, P10 13.10.
			expect(runPage).toMatch(/Equity IRR %\/yr 9\.50 5\.90 9\.50 13\.10/);
			expect(runPage).toMatch(/LCOE, real EUR\/MWh 245\.00 281\.00 245\.00 209\.00/);
			expect(runPage).toContain(P90_CONVENTION);
			expect(runPage).toContain('Minimum DSCR: 10 of 100 draws have none');
		});

		it('prints the probabilities, what was drawn and the histogram of the equity IRR', () => {
			for (const p of runProbabilities(handMadeSummary())) {
				expect(runPage).toContain(p.label);
				expect(runPage).toContain(p.value);
			}
			const all = read.flat.join(' ');
			expect(all).toContain('Capex triangular, 90 to 135 % of base, most likely 100 % of base');
			expect(all).toContain('Equity IRR: how 100 draws spread');
			expect(all).toContain('P90 5.90 %/yr');
			expect(read.imageCount).toBe(0);
		});

		it('prints the method note on probabilistic runs among the notes', () => {
			const notes = read.flat.slice(read.flat.findIndex((page) => page.includes(CHAPTERS.notes))).join(' ');
			expect(notes).toContain('Probabilistic runs: P10, P50 and P90 of every result');
		});

		it('leaves the run pages out of a summary without a run', async () => {
			const without = await renderAndRead(inputFor(example('tidal-stream-kestle-narrows'), { tornado: false }));
			expect(without.flat.join(' ')).not.toContain(P90_CONVENTION);
			expect(without.flat.join(' ')).not.toContain('how 100 draws spread');
		});
	});

	describe('a team copy', () => {
		let read: ReadBack;
		beforeAll(async () => {
			read = await renderAndRead({ ...inputFor(example('wave-orrin-bank'), { stamp: false, tornado: false }), edition: { label: 'Team copy', date: new Date('2026-03-14T09:00:00Z') } });
		});

		it('stamps no page and names no investor', () => {
			expect(read.flat.join(' ')).not.toContain('Prepared for');
			expect(read.flat.join(' ')).not.toContain(STAMP.email);
		});

		it('still carries the cautions and the edition on every page', () => {
			read.flat.forEach((page, i) => {
				for (const caution of CAUTIONS) expect(page, `page ${i + 1}`).toContain(caution);
				expect(page).toContain(`Team copy · Page ${i + 1} of ${read.pages.length}`);
			});
		});

		it('leaves the tornado out when none is given', () => {
			expect(read.flat.join(' ')).not.toContain('Tornado:');
		});
	});
});
