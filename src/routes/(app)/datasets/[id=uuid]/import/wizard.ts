/** Browser helpers of the upload wizard: sending the file and talking to the import API. */
import {
	batchStatusSchema,
	previewResponseSchema,
	uploadedTableSchema,
	type BatchStatus,
	type PreviewRequest,
	type PreviewResponse,
	type UploadedTable
} from '$lib/schemas/imports';
import type { z } from 'zod';
import { apiErrorMessage } from '$lib/api/error-message';

async function send<S extends z.ZodType>(
	method: string,
	url: string,
	body: unknown,
	schema?: S
): Promise<z.output<S>> {
	const res = await fetch(url, {
		method,
		headers: { 'content-type': 'application/json' },
		body: body === undefined ? undefined : JSON.stringify(body)
	});
	if (!res.ok) throw Object.assign(new Error(await apiErrorMessage(res)), { status: res.status });
	const data = await res.json();
	return schema ? schema.parse(data) : data;
}

/**
 * Send the original file to the dataset (it is kept there as the import's provenance), then let
 * the server parse it into a draft import.
 */
export async function uploadForImport(datasetId: string, file: File): Promise<UploadedTable> {
	const announced = (await send('POST', '/api/v1/attachments', {
		datasetId,
		fileName: file.name,
		sizeBytes: file.size
	})) as { id: string; uploadUrl: string };
	const put = await fetch(announced.uploadUrl, { method: 'PUT', body: file });
	if (!put.ok) throw new Error(await apiErrorMessage(put));
	return send(
		'POST',
		`/api/v1/datasets/${datasetId}/imports`,
		{ attachmentId: announced.id },
		uploadedTableSchema
	);
}

export const previewBatch = (batchId: string, request: PreviewRequest): Promise<PreviewResponse> =>
	send('POST', `/api/v1/imports/${batchId}/preview`, request, previewResponseSchema);

export const commitBatch = (batchId: string, revision: number, allowReimport: boolean) =>
	send('POST', `/api/v1/imports/${batchId}/commit`, { revision, allowReimport });

/** Poll an import until it finishes, reporting progress. */
export async function followImport(
	batchId: string,
	onProgress: (s: BatchStatus) => void
): Promise<BatchStatus> {
	for (;;) {
		const res = await fetch(`/api/v1/imports/${batchId}`);
		if (!res.ok) throw new Error(await apiErrorMessage(res));
		const status = batchStatusSchema.parse(await res.json());
		onProgress(status);
		if (status.status === 'done' || status.status === 'failed') return status;
		await new Promise((r) => setTimeout(r, 400));
	}
}
