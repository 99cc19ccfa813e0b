export const technologyLabels = {
	'tidal-stream': 'Tidal stream',
	'ocean-current': 'Ocean current',
	wave: 'Wave'
} as const;

export type Technology = keyof typeof technologyLabels;
