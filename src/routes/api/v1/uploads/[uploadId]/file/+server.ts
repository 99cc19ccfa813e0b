import { getUploadContent } from '$lib/server/db/uploads';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import { fileStem } from '$lib/server/workbench/export';
import type { RequestHandler } from './$types';

/** The file exactly as it was uploaded, always as an attachment (never rendered in the page). */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { uploadId } = await authorize(event, event.params, 'viewer');
	const file = await getUploadContent(uploadId);
	if (!file) throw new ApiProblem(404, 'No such upload, or it is not yours.');
	const safeName = `${fileStem(file.fileName.replace(/\.csv$/i, ''))}.csv`;
	return new Response(new Uint8Array(file.content), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${safeName}"`,
			'content-length': String(file.content.byteLength)
		}
	});
});
