/**
 * Browser side of an attachment upload: announce it, PUT the bytes straight to the object store
 * with progress (XMLHttpRequest, since fetch has no upload progress), then let the server check it.
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
	const { id, uploadUrl } = (await start.json()) as { id: string; uploadUrl: string };

	await new Promise<void>((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('PUT', uploadUrl);
		xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
		xhr.onload = () =>
			xhr.status >= 200 && xhr.status < 300
				? resolve()
				: reject(new Error(`the file store answered ${xhr.status}`));
		xhr.onerror = () => reject(new Error('the file store could not be reached'));
		xhr.send(file);
	});
	onProgress(1);

	const done = await fetch(`/api/v1/attachments/${id}/complete`, { method: 'POST' });
	if (!done.ok) throw new Error(await messageOf(done));
	return done.json();
}
