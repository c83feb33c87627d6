/**
 * Browser side of an attachment upload: announce it, then PUT the bytes to the path the app gave
 * (on its own origin; the app checks and stores them and answers with the checked file), with
 * progress through XMLHttpRequest, since fetch has no upload progress.
 */
export interface UploadedFile {
	id: string;
	fileName: string;
	contentType: string | null;
	hasThumbnail: boolean;
}

async function messageOf(res: Response): Promise<string> {
	const body = await res.json().catch(() => null);
	return body?.message ?? `${res.status} ${res.statusText}`;
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
	if (!start.ok) throw new Error(await messageOf(start));
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
			let message = `${xhr.status} ${xhr.statusText}`;
			try {
				message = JSON.parse(xhr.responseText).message ?? message;
			} catch {
				// not JSON: keep the status line
			}
			reject(new Error(message));
		};
		xhr.onerror = () => reject(new Error('the server could not be reached'));
		xhr.send(file);
	});
	return JSON.parse(body) as UploadedFile;
}
