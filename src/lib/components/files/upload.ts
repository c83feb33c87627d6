/**
 * Browser side of an attachment upload: announce it, then PUT the bytes to the path the app gave
 * (on its own origin; the app checks and stores them and answers with the checked file), with
 * progress through XMLHttpRequest, since fetch has no upload progress.
 */
import { apiErrorMessage, errorMessageOf } from '$lib/api/error-message';

export interface UploadedFile {
	id: string;
	fileName: string;
	contentType: string | null;
	hasThumbnail: boolean;
}

export async function uploadAttachment(
	file: File,
	target: { datasetId: string; siteId?: string | null },
	onProgress: (fraction: number) => void
): Promise<UploadedFile> {
	const start = await fetch('/api/v1/attachments', {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ ...target, fileName: file.name, sizeBytes: file.size })
	});
	if (!start.ok) throw new Error(await apiErrorMessage(start));
	const { uploadUrl } = (await start.json()) as { uploadUrl: string };

	const body = await new Promise<string>((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('PUT', uploadUrl);
		// The bytes decide the type on the server; say nothing about it here.
		xhr.setRequestHeader('content-type', 'application/octet-stream');
		xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
		xhr.upload.onload = () => onProgress(1);
		xhr.onload = () => {
			if (xhr.status >= 200 && xhr.status < 300) return resolve(xhr.responseText);
			let body: unknown = null;
			try {
				body = JSON.parse(xhr.responseText);
			} catch {
				// not JSON: the status line below
			}
			reject(new Error(errorMessageOf(body, `${xhr.status} ${xhr.statusText}`)));
		};
		xhr.onerror = () => reject(new Error('the server could not be reached'));
		xhr.send(file);
	});
	return JSON.parse(body) as UploadedFile;
}
