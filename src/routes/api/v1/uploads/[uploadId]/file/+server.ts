import { getUploadContent } from '$lib/server/db/uploads';
import { authorize } from '$lib/server/auth/access';
import { ApiProblem, apiRoute } from '$lib/server/workbench/api-route';
import { fileStem } from '$lib/server/workbench/export';
import { uploadDownload } from '$lib/server/workbench/upload-download';
import type { RequestHandler } from './$types';

/**
 * The file as it was uploaded, always as an attachment (never rendered in the
 * page), with any cell a spreadsheet would run as a formula defused the way
 * the exports do it (upload-download.ts).
 */
export const GET: RequestHandler = apiRoute(async (event) => {
	const { uploadId } = await authorize(event, event.params, 'viewer');
	const file = await getUploadContent(uploadId);
	if (!file) throw new ApiProblem(404, 'No such upload, or it is not yours.');
	const download = uploadDownload(new Uint8Array(file.content));
	const stem = fileStem(file.fileName.replace(/\.csv$/i, ''));
	const safeName = download.contentType === 'application/octet-stream' ? `${stem}.bin` : `${stem}.csv`;
	return new Response(download.bytes, {
		headers: {
			'content-type': download.contentType,
			'content-disposition': `attachment; filename="${safeName}"`,
			'content-length': String(download.bytes.byteLength)
		}
	});
});
