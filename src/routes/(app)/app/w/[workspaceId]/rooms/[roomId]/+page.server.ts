import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { authorize } from '$lib/server/auth/access';
import { roleAtLeast } from '$lib/server/auth/roles';
import { listGuestsOfRoom, listQuestions, listRoomDocuments, listRoomVersions } from '$lib/server/db/rooms';
import { listScenariosInProject } from '$lib/server/db/scenarios';
import { answerRoomQuestion, attachDocument, changeTerms, inviteGuest, publishVersion, removeDocument, revokeGuest, RoomProblem } from '$lib/server/rooms/team';
import { roomTermsSchema } from '$lib/server/rooms/terms';
import { PublishProblem } from '$lib/server/rooms/snapshot';
import { PlanRefusal } from '$lib/server/billing/gates';
import { ApiProblem } from '$lib/server/workbench/api-route';
import { readForm } from '$lib/server/forms';
import { UNSTORABLE_TEXT_MESSAGE, unstorableTextPaths } from '$lib/server/storable-text';
import { planAllows } from '$lib/billing/plans';
import { ROOM_DOCUMENT_MAX_BYTES } from '$lib/server/rooms/document-check';
import { latestDoneRuns, type PublishableRun } from '$lib/server/rooms/publishable-runs';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

export const load: PageServerLoad = async (event) => {
	const { project, membership, room } = await authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'viewer');
	const [versions, scenarios, documents, guests, questions] = await Promise.all([
		listRoomVersions(room.id),
		listScenariosInProject(project.id),
		listRoomDocuments(room.id),
		listGuestsOfRoom(room.id),
		listQuestions(room.id)
	]);
	const plan = planAllows(membership, 'dataRooms', 'change');
	const canChange = roleAtLeast(membership.role, 'analyst') && plan.allowed;
	// A run can go with a scenario only where the plan lets runs be shown to investors.
	const runs = canChange && planAllows(membership, 'probabilisticRuns', 'share').allowed ? await latestDoneRuns(scenarios) : new Map<string, PublishableRun>();
	return {
		workspaceId: membership.workspaceId,
		project: { id: project.id, name: project.name },
		room: { id: room.id, name: room.name, terms: room.terms, termsVersion: room.terms_version },
		versions: versions.map((v) => ({ ...v, publishedAt: v.publishedAt.toISOString() })),
		scenarios: scenarios.map((s) => {
			const run = runs.get(s.id);
			return { id: s.id, name: s.name, revision: s.revision, isBaseCase: s.isBaseCase, latestRun: run ? { draws: run.draws, finishedAt: run.finishedAt.toISOString() } : null };
		}),
		documents: documents.map((d) => ({ id: d.id, folder: d.folder, fileName: d.fileName, kind: d.kind, byteSize: d.byteSize, access: d.access, sha256: d.sha256 })),
		guests: guests.map((g) => ({
			...g,
			expiresAt: g.expiresAt.toISOString(),
			revokedAt: g.revokedAt?.toISOString() ?? null,
			invitedAt: g.invitedAt.toISOString(),
			lastVisit: g.lastVisit ? new Date(g.lastVisit).toISOString() : null,
			acceptedCurrentTerms: g.acceptedTermsVersion === room.terms_version
		})),
		questions: questions.map((q) => ({ ...q, askedAt: q.askedAt.toISOString(), answeredAt: q.answeredAt?.toISOString() ?? null })),
		canChange,
		planMessage: plan.allowed ? null : plan.message,
		maxDocumentMB: ROOM_DOCUMENT_MAX_BYTES / 1024 / 1024
	};
};

async function changer(event: RequestEvent) {
	return authorize(event, { workspaceId: event.params.workspaceId, roomId: event.params.roomId }, 'analyst');
}

/** Refusals in words for the form that was sent; anything else is a real failure. */
function refused(action: string, e: unknown) {
	if (e instanceof RoomProblem || e instanceof PublishProblem) return fail(400, { action, message: e.message });
	if (e instanceof PlanRefusal) return fail(402, { action, message: e.message });
	if (e instanceof ApiProblem) return fail(e.status, { action, message: e.message });
	throw e;
}

const inviteForm = z.object({
	email: z.email({ message: 'Enter the investor’s e-mail address.' }),
	name: z.string().trim().max(200).default(''),
	accessUntil: z.iso.date({ message: 'Choose the last day of access.' })
});
const answerForm = z.object({
	questionId: z.uuid({ message: 'Choose a question.' }),
	answer: z.string().trim().min(1, 'Write the answer.').max(8000, 'At most 8,000 characters.'),
	visibility: z.enum(['asker', 'all'], { message: 'Choose who sees the answer.' })
});

export const actions: Actions = {
	publish: async (event) => {
		const access = await changer(event);
		const form = await event.request.formData();
		const ids = form.getAll('scenarioId').map(String);
		const withRunOf = form.getAll('withRunOf').map(String);
		try {
			const version = await publishVersion(access, ids, { withRunOf });
			return { action: 'publish', done: `Version ${version} is published: investors see it from now on.` };
		} catch (e) {
			return refused('publish', e);
		}
	},

	upload: async (event) => {
		const access = await changer(event);
		const form = await event.request.formData();
		const file = form.get('file');
		if (!(file instanceof File) || file.size === 0) return fail(400, { action: 'upload', message: 'Choose a file to attach.' });
		const folder = String(form.get('folder') ?? '').trim().slice(0, 100);
		const documentAccess = form.get('access') === 'download' ? 'download' : 'view';
		if (unstorableTextPaths({ folder }).length > 0) return fail(400, { action: 'upload', message: `The folder name ${UNSTORABLE_TEXT_MESSAGE}.` });
		try {
			const document = await attachDocument(access, { fileName: file.name, bytes: new Uint8Array(await file.arrayBuffer()), folder, access: documentAccess });
			return { action: 'upload', done: `${document.fileName} is attached (${documentAccess === 'view' ? 'view only' : 'download allowed'}).` };
		} catch (e) {
			return refused('upload', e);
		}
	},

	removeDocument: async (event) => {
		const access = await changer(event);
		const id = (await readForm(event.request)).documentId ?? '';
		try {
			if (!z.uuid().safeParse(id).success || !(await removeDocument(access, id))) return fail(404, { action: 'removeDocument', message: 'That document is not in this room.' });
		} catch (e) {
			return refused('removeDocument', e);
		}
		return { action: 'removeDocument', done: 'The document is removed from the room.' };
	},

	invite: async (event) => {
		const access = await changer(event);
		const parsed = inviteForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'invite', message: parsed.error.issues[0].message });
		try {
			// Access runs to the end of the chosen day, UTC.
			await inviteGuest(access, { email: parsed.data.email, name: parsed.data.name, accessUntil: new Date(`${parsed.data.accessUntil}T23:59:59Z`), origin: event.url.origin });
		} catch (e) {
			return refused('invite', e);
		}
		return { action: 'invite', done: `${parsed.data.email} is invited; the mail with a single-use link is on its way.` };
	},

	revoke: async (event) => {
		const access = await changer(event);
		const guestId = (await readForm(event.request)).guestId ?? '';
		if (!z.uuid().safeParse(guestId).success || !(await revokeGuest(access, guestId))) return fail(404, { action: 'revoke', message: 'That investor has no open access to this room.' });
		return { action: 'revoke', done: 'Access ended at once.' };
	},

	answer: async (event) => {
		const access = await changer(event);
		const parsed = answerForm.safeParse(await readForm(event.request));
		if (!parsed.success) return fail(400, { action: 'answer', message: parsed.error.issues[0].message });
		try {
			await answerRoomQuestion(access, { ...parsed.data, origin: event.url.origin });
		} catch (e) {
			return refused('answer', e);
		}
		return { action: 'answer', done: parsed.data.visibility === 'all' ? 'Answered, for every investor in the room.' : 'Answered, for the investor who asked.' };
	},

	terms: async (event) => {
		const access = await changer(event);
		const terms = roomTermsSchema.safeParse((await readForm(event.request)).terms ?? '');
		if (!terms.success) return fail(400, { action: 'terms', message: terms.error.issues[0].message });
		try {
			await changeTerms(access, terms.data);
		} catch (e) {
			return refused('terms', e);
		}
		return { action: 'terms', done: 'New terms saved: every investor accepts them again before the room opens.' };
	}
};
