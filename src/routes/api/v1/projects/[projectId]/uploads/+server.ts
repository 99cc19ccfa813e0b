import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { exactTimestampPattern } from '$lib/server/db/keyset';
import { listUploadsPage } from '$lib/server/db/uploads';
import { authorize } from '$lib/server/auth/access';
import { apiError } from '$lib/server/api';
import { apiRoute } from '$lib/server/workbench/api-route';
import { nextCursor, readPageRequest } from '$lib/server/workbench/paging';
import { receiveUpload } from '$lib/server/workbench/receive-upload';
import { takeComputeAllowance } from '$lib/server/compute/limits';
import { readUploadForm } from '$lib/server/workbench/upload-form';
import { uploadJson, uploadSummaryJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';
import { requireLiveProject } from '$lib/server/workbench/live-project';

const uploadKey = z.tuple([z.string().regex(exactTimestampPattern), z.uuid()]);

/** The project's uploads, newest first, a page at a time (`?limit=`, `?cursor=`). */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { project } = await authorize(event, event.params, 'viewer');
	const page = await listUploadsPage(project.id, readPageRequest(event.url, 'uploads', uploadKey));
	return json({ uploads: page.items.map(uploadSummaryJson), nextCursor: nextCursor('uploads', page.nextKey) });
});

/**
 * Multipart `kind` + `file`. A file with any bad row answers 422 with every
 * row and column error (issues with `row` and `column`) and stores nothing;
 * a good file is stored with its parsed data, answered as the preview. The
 * parse runs on the compute pool, within the user's limit of uploads.
 */
export const POST: RequestHandler = apiRoute(async (event) => {
	const { project, user } = await authorize(event, event.params, 'analyst');
	requireLiveProject(project);
	const form = await readUploadForm(event.request);
	await takeComputeAllowance(user.id, 'upload');
	const received = await receiveUpload({ projectId: project.id, userId: user.id, ...form });
	if (!received.ok) {
		const count = received.errors.length;
		return apiError(
			422,
			`The file was not saved: ${count === 1 ? 'it has a problem' : `it has ${count} problems`}. Fix ${count === 1 ? 'it' : 'them'} and upload it again.`,
			received.errors.map((e) => ({ path: 'file', message: e.message, row: e.row, column: e.column }))
		);
	}
	return json({ upload: uploadJson(received.upload) }, { status: 201 });
});
