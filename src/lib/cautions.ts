/** The cautions every results surface and export carries, in Tidewright's words. */
export const CAUTIONS: readonly string[] = [
	'Figures here are estimates for screening and discussion.',
	'They are not investment advice and not a certified resource or yield assessment.',
	'Offshore installation, marine licensing, navigation and environmental consent follow local codes and licensed practice.'
];
