/**
 * The summary's look: Tidewright's palette (from tailwind.config.ts, the one
 * source of the app's colours), type sizes and the page geometry.
 */
import tailwind from '../../../../tailwind.config';

const { abyss, sand, copper, kelp, flare } = tailwind.theme.extend.colors;

export const colours = {
	ink: abyss[900],
	deep: abyss[800],
	text: abyss[700],
	muted: abyss[500],
	faint: abyss[300],
	rule: sand[200],
	band: sand[100],
	paper: sand[50],
	stripe: abyss[50],
	accent: copper[500],
	/** Chart series, as the app's charts draw them (src/lib/components/charts/palette.ts). */
	positive: kelp[500],
	positiveLight: kelp[400],
	negative: copper[400],
	high: copper[500],
	line: abyss[700],
	target: flare[500],
	heatLow: abyss[50],
	heatHigh: abyss[700]
} as const;

export const type = {
	title: 28,
	heading: 17,
	subheading: 11.5,
	body: 9.5,
	small: 8,
	table: 7.5,
	tiny: 6.5
} as const;

/** A4 in points; the cash-flow table's pages turn to landscape. */
export const page = {
	size: 'A4',
	margin: { top: 64, bottom: 78, left: 50, right: 50 },
	/** The header sits in the top margin, the footer in the bottom one. */
	headerY: 30,
	footerGap: 10
} as const;
