/** The messages Tidewright sends, each as plain text and HTML in the same words. */
export interface MailContent {
	subject: string;
	text: string;
	html: string;
}

function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function layout(paragraphs: string[], action: { label: string; url: string }, footer: string): MailContent['html'] {
	const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
	return `<!doctype html><html><body style="margin:0;background:#fbf9f4;font-family:Helvetica,Arial,sans-serif;color:#0c2130">
<div style="max-width:520px;margin:0 auto;padding:28px">
<p style="font-family:Georgia,serif;font-size:20px;margin:0 0 20px">Tidewright</p>
${body}
<p style="margin:22px 0"><a href="${escapeHtml(action.url)}" style="background:#c8643b;color:#fff;padding:10px 18px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p>
<p style="font-size:13px;color:#3e6e85;margin:0 0 8px">If the button does not work, paste this address into your browser:<br>${escapeHtml(action.url)}</p>
<p style="font-size:12px;color:#3e6e85;margin-top:24px">${escapeHtml(footer)}</p>
</div></body></html>`;
}

function text(paragraphs: string[], action: { label: string; url: string }, footer: string): string {
	return [...paragraphs, `${action.label}: ${action.url}`, '', footer].join('\n\n');
}

function message(subject: string, paragraphs: string[], action: { label: string; url: string }, footer: string): MailContent {
	return { subject, text: text(paragraphs, action, footer), html: layout(paragraphs, action, footer) };
}

export function verifyEmailMessage(input: { name: string; url: string; hoursValid: number }): MailContent {
	return message(
		'Confirm your e-mail address for Tidewright',
		[
			`Hello ${input.name || 'there'},`,
			'You (or someone using your address) made a Tidewright account. Confirm the address so we can send you invitations and password resets.',
			`The link works once and for ${input.hoursValid} hours.`
		],
		{ label: 'Confirm my address', url: input.url },
		'If you did not sign up, ignore this message and no account will be confirmed.'
	);
}

export function passwordResetMessage(input: { name: string; url: string; minutesValid: number }): MailContent {
	return message(
		'Choose a new Tidewright password',
		[
			`Hello ${input.name || 'there'},`,
			'Someone asked to reset the password of the Tidewright account for this address. Follow the link to choose a new one; every device signed in to the account will be signed out.',
			`The link works once and for ${input.minutesValid} minutes.`
		],
		{ label: 'Choose a new password', url: input.url },
		'If you did not ask for this, ignore this message: your password stays as it is.'
	);
}

export function invitationMessage(input: {
	inviterName: string;
	workspaceName: string;
	role: string;
	url: string;
	daysValid: number;
}): MailContent {
	return message(
		`${input.inviterName} invited you to ${input.workspaceName} on Tidewright`,
		[
			`${input.inviterName} invited you to join the workspace “${input.workspaceName}” as ${input.role === 'analyst' || input.role === 'owner' ? 'an' : 'a'} ${input.role}.`,
			'Tidewright is where the team keeps its ocean-energy project cases: resource, costs, financing and results.',
			`Accept with an existing account or make a new one. The invitation is open for ${input.daysValid} days.`
		],
		{ label: 'Open the invitation', url: input.url },
		'If you do not know this person or workspace, ignore this message.'
	);
}

/** Sent instead of a confirmation link when someone signs up with an address that already has an account. */
export function existingAccountMessage(input: { name: string; signInUrl: string; resetUrl: string }): MailContent {
	return message(
		'Your address already has a Tidewright account',
		[
			`Hello ${input.name || 'there'},`,
			'Someone (perhaps you) tried to make a new Tidewright account with this address. It already has one, so nothing was made and nothing changed.',
			`If it was you, sign in with your password. Forgotten it? Choose a new one here: ${input.resetUrl}`
		],
		{ label: 'Sign in', url: input.signInUrl },
		'If it was not you, you can ignore this message: your account and password stay as they are.'
	);
}

export function roomInvitationMessage(input: { inviterName: string; workspaceName: string; roomName: string; projectName: string; url: string; daysValid: number; accessUntil: Date }): MailContent {
	return message(
		`${input.workspaceName} shares a data room with you: ${input.roomName}`,
		[
			`${input.inviterName} of ${input.workspaceName} invites you to the data room "${input.roomName}" for the project ${input.projectName} on Tidewright.`,
			`The room holds the published figures, their method notes and documents. Your access runs until ${input.accessUntil.toISOString().slice(0, 10)}; you will be asked to accept the room's confidentiality terms first.`,
			`The link works once and for ${input.daysValid} days: it signs you in, and asks you to choose a password the first time.`
		],
		{ label: 'Open the data room', url: input.url },
		'You are not a member of their workspace: you see only the rooms you are invited to. If you did not expect this, ignore this mail.'
	);
}

export function roomSignInLinkMessage(input: { url: string; minutesValid: number }): MailContent {
	return message(
		'Your sign-in link for Tidewright data rooms',
		['Someone (probably you) asked for a link to sign in to the data rooms shared with this address.', `The link works once and for ${input.minutesValid} minutes.`],
		{ label: 'Sign in', url: input.url },
		'If you did not ask for it, ignore this mail: nothing changes.'
	);
}

export function roomQuestionMessage(input: { roomName: string; askedBy: string; question: string; url: string }): MailContent {
	return message(
		`A question in the data room ${input.roomName}`,
		[`${input.askedBy} asked:`, input.question],
		{ label: 'Answer it', url: input.url },
		'You receive this as an owner or analyst of the workspace that shares the room.'
	);
}

export function roomAnswerMessage(input: { roomName: string; question: string; answer: string; url: string }): MailContent {
	return message(
		`Your question in ${input.roomName} has an answer`,
		['You asked:', input.question, 'The answer:', input.answer],
		{ label: 'Open the data room', url: input.url },
		'You receive this because you asked the question in this data room.'
	);
}
