import { json } from '@sveltejs/kit';
import { getUploadById } from '$lib/server/db/uploads';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import { uploadJson } from '$lib/server/workbench/serialize';
import type { RequestHandler } from './$types';

/** The upload's parsed data, summary and warnings (the file itself at .../file). */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { uploadId } = await authorize(event, event.params, 'viewer');
	const upload = await getUploadById(uploadId);
	if (!upload) throw new ApiProblem(404, 'No such upload, or it is not yours.');
	return json({ upload: uploadJson(upload) });
});
