import { describe, expect, it } from 'vitest';
import { parseNote } from './parse-note';

const note = [
	'# Net present value',
	'',
	'The *sum* of discounted cash flows, valued at [COD](time-convention.md).',
	'',
	'```',
	'NPV = Σ CF_t / (1 + r)^t',
	'```',
	'',
	'<script>alert(1)</script>',
	'',
	'See [the IRR note](./irr.md#degenerate-cases) and [a standard](https://example.org/std).'
].join('\n');

describe('parseNote', () => {
	it('takes the title from the first heading and the summary from the first paragraph', () => {
		const parsed = parseNote('npv', note);
		expect(parsed.title).toBe('Net present value');
		expect(parsed.summary).toBe('The sum of discounted cash flows, valued at COD.');
		expect(parsed.html).not.toContain('<h1>');
	});

	it('keeps the formula as a code block and escapes raw HTML', () => {
		const { html } = parseNote('npv', note);
		expect(html).toContain('<pre><code>NPV = Σ CF_t / (1 + r)^t\n</code></pre>');
		expect(html).not.toContain('<script>');
		expect(html).toContain('&lt;script&gt;');
	});

	it('leads links to sibling notes to their pages and marks outside links', () => {
		const { html } = parseNote('npv', note);
		expect(html).toContain('href="/app/methods/time-convention"');
		expect(html).toContain('href="/app/methods/irr#degenerate-cases"');
		expect(html).toContain('href="https://example.org/std" rel="noopener noreferrer"');
	});

	it('falls back to the given title without a heading and skips front matter', () => {
		const parsed = parseNote('lcoe', '---\nsource: x\n---\nLCOE is cost over energy.\n', 'LCOE');
		expect(parsed.title).toBe('LCOE');
		expect(parsed.summary).toBe('LCOE is cost over energy.');
		expect(parsed.html).not.toContain('source: x');
	});
});
