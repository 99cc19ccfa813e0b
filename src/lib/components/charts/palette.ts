/** Tidewright's chart colours, matching tailwind.config.ts. */
export const chartColours = {
	abyss: '#1d4357',
	abyssLight: '#8fb0c0',
	copper: '#c8643b',
	copperLight: '#e08a5c',
	kelp: '#2f7d6d',
	kelpLight: '#5aa58f',
	sand: '#c9b88f',
	flare: '#b3322f'
} as const;

export const seriesColours = [chartColours.kelp, chartColours.copper, chartColours.abyss, chartColours.sand, chartColours.kelpLight, chartColours.copperLight];
