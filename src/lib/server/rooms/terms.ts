import { z } from 'zod';

/** The confidentiality terms a room's investors accept, as the team writes them (new room or changed terms). */
export const roomTermsSchema = z
	.string()
	.trim()
	.min(20, 'Write the confidentiality terms investors accept (at least 20 characters).')
	.max(20_000, 'At most 20,000 characters.');

/** The confidentiality terms a new room starts with; the team can change them (investors then accept again). */
export const DEFAULT_TERMS_TEXT =
	'The figures, documents and answers in this room are confidential. They are shared to evaluate the project named here, may not be passed on without the written consent of the sponsor, and are estimates: not investment advice, not a certified yield assessment.';
