/** The confidentiality terms a new room starts with; the team can change them (investors then accept again). */
export const DEFAULT_TERMS_TEXT =
	'The figures, documents and answers in this room are confidential. They are shared to evaluate the project named here, may not be passed on without the written consent of the sponsor, and are estimates: not investment advice, not a certified yield assessment.';
