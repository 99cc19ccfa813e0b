import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { guestRoom } from '$lib/server/rooms/guest-access';
import { insertQuestion, listRoomDocuments, recordRoomEvent } from '$lib/server/db/rooms';
import { questionsForGuest } from '$lib/server/rooms/team';
import { listMembers } from '$lib/server/db/memberships';
import { sendMail } from '$lib/server/mail/mailer';
import { roomQuestionMessage } from '$lib/server/mail/templates';
import { afterResponse } from '$lib/server/after-response';
import { readForm } from '$lib/server/forms';
import { KEY_FIGURES } from '$lib/server/workbench/stored-results';
import type { Actions, PageServerLoad } from './$types';

/** The room as an investor sees it: the latest published version, its documents and the questions. */
export const load: PageServerLoad = async (event) => {
	const { guest, room, version } = await guestRoom(event, event.params.roomId);
	await recordRoomEvent({ roomId: room.id, version: version?.version ?? null, guestId: guest.id, kind: 'room-view', targetName: room.name });
	const [documents, questions] = await Promise.all([listRoomDocuments(room.id), questionsForGuest(room.id, guest.id)]);
	const snapshot = version?.snapshot ?? null;
	return {
		room: { id: room.id, name: room.name },
		version: version && snapshot
			? {
					number: version.version,
					publishedAt: version.publishedAt.toISOString(),
					engineVersion: snapshot.engineVersion,
					project: snapshot.project,
					cautions: snapshot.cautions,
					scenarios: snapshot.scenarios.map((s, index) => ({
						position: index + 1,
						name: s.name,
						notes: s.notes,
						revision: s.revision,
						isBaseCase: s.isBaseCase,
						currency: s.result.currency,
						figures: Object.fromEntries(KEY_FIGURES.map((k) => [k, s.result.metrics[k] ?? null])) as Record<(typeof KEY_FIGURES)[number], string | null>,
						// Shown beside the minimum DSCR; a version published before they were reported has none.
						coverShortfalls: s.result.coverShortfalls ?? null
					}))
				}
			: null,
		documents: documents.map((d) => ({ id: d.id, folder: d.folder, fileName: d.fileName, kind: d.kind, byteSize: d.byteSize, access: d.access })),
		questions: questions.map((q) => ({ id: q.id, mine: q.guestId === guest.id, question: q.question, askedAt: q.askedAt.toISOString(), answer: q.answer, answeredAt: q.answeredAt?.toISOString() ?? null }))
	};
};

const questionForm = z.object({ question: z.string().trim().min(3, 'Write the question (at least 3 characters).').max(4000, 'At most 4,000 characters.') });

export const actions: Actions = {
	ask: async (event) => {
		const { guest, room } = await guestRoom(event, event.params.roomId);
		const fields = await readForm(event.request);
		const parsed = questionForm.safeParse(fields);
		if (!parsed.success) return fail(400, { question: fields.question ?? '', message: parsed.error.issues[0].message });
		await insertQuestion(room.id, guest.id, parsed.data.question);
		const origin = event.url.origin;
		void afterResponse('Telling the team about a room question', async () => {
			const team = (await listMembers(room.workspace_id)).filter((m) => m.role !== 'viewer');
			for (const member of team) {
				await sendMail(member.email, roomQuestionMessage({ roomName: room.name, askedBy: guest.email, question: parsed.data.question, url: `${origin}/app/w/${room.workspace_id}/rooms/${room.id}` }));
			}
		});
		return { question: '', message: null, asked: true };
	}
};
