/**
 * Reading an upload request: multipart form data with `kind` and `file`.
 * Every refusal names the field it concerns.
 */
import { uploadKindSchema, type UploadKind } from '../../schemas/workbench';
import { ApiProblem } from './api-route';
import { MAX_UPLOAD_BYTES } from './receive-upload';

export interface UploadForm {
	kind: UploadKind;
	fileName: string;
	contentType: string;
	bytes: Uint8Array;
}

const MAX_FILE_NAME = 255;

export async function readUploadForm(request: Request): Promise<UploadForm> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.toLowerCase().startsWith('multipart/form-data')) {
		throw new ApiProblem(415, 'Send the file as multipart/form-data with the fields "kind" and "file".', [
			{ path: '(body)', message: `content type is ${type || 'missing'}` }
		]);
	}
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		throw new ApiProblem(400, 'The upload could not be read as multipart/form-data.');
	}
	const issues: { path: string; message: string }[] = [];
	const kindValue = form.get('kind');
	const kind = uploadKindSchema.safeParse(typeof kindValue === 'string' ? kindValue : undefined);
	if (!kind.success) issues.push({ path: 'kind', message: kind.error.issues[0].message });
	const file = form.get('file');
	if (!(file instanceof File)) issues.push({ path: 'file', message: 'choose a file to upload' });
	if (issues.length > 0 || !(file instanceof File) || !kind.success) throw new ApiProblem(422, 'The upload needs a kind and a file.', issues);

	if (file.size > MAX_UPLOAD_BYTES) {
		const mb = (n: number) => `${(n / (1024 * 1024)).toFixed(1)} MB`;
		const message = `The file is ${mb(file.size)}, over the ${mb(MAX_UPLOAD_BYTES)} limit for uploads. Split it into smaller files or average it to a longer interval.`;
		throw new ApiProblem(413, message, [{ path: 'file', message }]);
	}
	// A cut at the length limit could split a surrogate pair: make it well formed after cutting.
	const fileName = (file.name || 'upload.csv').replace(/[\u0000-\u001f\u007f]/g, '').slice(0, MAX_FILE_NAME).toWellFormed();
	return { kind: kind.data, fileName, contentType: file.type.slice(0, 200), bytes: new Uint8Array(await file.arrayBuffer()) };
}
