/**
 * The palette in tailwind.config.ts against WCAG 2.1's contrast minimum: the
 * shades the config names for text reach 4.5:1 on the light grounds, and the
 * primary button's white label does so on its copper in both states.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import config from '../../../tailwind.config';

type Palette = Record<string, Record<string, string>>;
const palette = config.theme.extend.colors as Palette;

/** Relative luminance of an sRGB colour, WCAG 2.1 § "relative luminance" (its 0.03928 threshold). */
function luminance(hex: string): number {
	const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1 § "contrast ratio": (L1 + 0.05) / (L2 + 0.05), the lighter colour's luminance over the darker's. */
function contrast(a: string, b: string): number {
	const [light, dark] = [luminance(a), luminance(b)].sort((x, y) => y - x);
	return (light + 0.05) / (dark + 0.05);
}

function colour(name: string): string {
	if (name === 'white') return '#ffffff';
	const [family, shade] = name.split('-');
	const hex = palette[family]?.[shade];
	if (!hex) throw new Error(`${name} is not in the palette`);
	return hex;
}

describe('the contrast formula', () => {
	it('gives the ends of the scale', () => {
		// WCAG 2.1: ratios range from 1:1 to 21:1 (black on white).
		expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
		expect(contrast('#3e6e85', '#3e6e85')).toBeCloseTo(1, 5);
	});

	it('agrees with published checkers', () => {
		// From memory: #767676 is the lightest grey that passes AA on white, 4.54:1 in WebAIM's contrast checker.
		expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
		// axe-core 4.14 (through @axe-core/playwright 4.14.0) reported white on #c8643b as 3.93:1 on the API reference page.
		expect(contrast('#ffffff', '#c8643b')).toBeCloseTo(3.93, 2);
	});
});

describe('the palette', () => {
	const textShades = ['abyss-500', 'abyss-600', 'abyss-700', 'abyss-800', 'abyss-900', 'copper-600', 'copper-700', 'kelp-500', 'kelp-600', 'flare-500'];
	const lightGrounds = ['white', 'sand-50'];

	it.each(textShades.flatMap((text) => lightGrounds.map((ground) => [text, ground])))('%s text on %s reaches 4.5:1 (WCAG 2.1 SC 1.4.3)', (text, ground) => {
		expect(contrast(colour(text), colour(ground))).toBeGreaterThanOrEqual(4.5);
	});

	it('keeps the light tints off text: abyss-300 and copper-500 fall short on white', () => {
		expect(contrast(colour('abyss-300'), colour('white'))).toBeLessThan(4.5);
		expect(contrast(colour('copper-500'), colour('white'))).toBeLessThan(4.5);
	});

	it('gives the primary button a white label at 4.5:1 or more, at rest and under the pointer', () => {
		const css = readFileSync(new URL('../../app.css', import.meta.url), 'utf8');
		const rule = /@utility btn-primary\s*{\s*@apply ([^;]+);/.exec(css)?.[1];
		expect(rule, 'btn-primary in app.css').toBeTruthy();
		const classes = rule!.split(/\s+/);
		expect(classes).toContain('text-white');
		const grounds = classes.filter((c) => /^(hover:)?bg-/.test(c)).map((c) => c.replace(/^(hover:)?bg-/, ''));
		expect(grounds.length).toBe(2);
		for (const ground of grounds) expect(contrast('#ffffff', colour(ground)), `white on ${ground}`).toBeGreaterThanOrEqual(4.5);
	});

	it('draws the focus ring at 3:1 or more against the light grounds (WCAG 2.1 SC 1.4.11)', () => {
		const css = readFileSync(new URL('../../app.css', import.meta.url), 'utf8');
		const ring = /:focus-visible\s*{\s*@apply [^;]*outline-(copper-\d+)/.exec(css)?.[1];
		expect(ring, 'the focus-visible outline colour in app.css').toBeTruthy();
		for (const ground of lightGrounds) expect(contrast(colour(ring!), colour(ground))).toBeGreaterThanOrEqual(3);
	});
});
