import { expect } from 'vitest';
import { Client } from './http';

/** Create a draft dataset in Korvald Geological Survey through the form; returns its id. */
export async function createDraftDataset(client: Client, title: string): Promise<string> {
	const res = await client.post('/datasets/new', {
		organisationId: 'org-korvald-survey',
		title,
		abstract: 'Integration test dataset (invented).',
		keywords: 'test',
		licence: 'CC-BY-4.0',
		citation: '',
		doi: '',
		visibility: 'private',
		embargoUntil: ''
	});
	expect(res.status).toBe(303);
	return res.headers.get('location')!.split('/').pop()!;
}

/**
 * Upload a file as the wizard does: announce it as an attachment of the dataset, send its bytes,
 * then start a draft import from it. Returns the start's answer (batch id, headers, suggested
 * mapping) or throws with the status and message.
 */
export async function uploadForImport(
	client: Client,
	datasetId: string,
	fileName: string,
	content: string | Uint8Array
) {
	const bytes = typeof content === 'string' ? new TextEncoder().encode(content) : content;
	const announced = await client.json('/api/v1/attachments', {
		datasetId,
		fileName,
		sizeBytes: bytes.byteLength
	});
	if (announced.status !== 201) throw new Error(`announce: ${announced.status}`);
	const { id, uploadUrl } = await announced.json();
	const put = await client.put(uploadUrl, bytes);
	if (put.status !== 200) throw new Error(`content: ${put.status} ${await put.text()}`);
	const started = await client.json(`/api/v1/datasets/${datasetId}/imports`, { attachmentId: id });
	const body = await started.json();
	if (started.status !== 201) throw new Error(`start: ${started.status} ${body.error?.message}`);
	return body as {
		batchId: string;
		headers: string[];
		rowCount: number;
		suggested: Record<string, { column: number; unit?: string }>;
	};
}

/** Preview a draft with the suggested mapping (or another) and edits; returns the response. */
export function previewRequest(
	client: Client,
	batchId: string,
	body: Record<string, unknown>
): Promise<Response> {
	return client.json(`/api/v1/imports/${batchId}/preview`, body);
}

/** Upload and preview with the suggested mapping; returns the batch id and the preview. */
export async function uploadAndPreview(
	client: Client,
	datasetId: string,
	fileName: string,
	content: string | Uint8Array,
	extra: Record<string, unknown> = {}
) {
	const up = await uploadForImport(client, datasetId, fileName, content);
	const res = await previewRequest(client, up.batchId, {
		mapping: up.suggested,
		epsg: 4326,
		...extra
	});
	const preview = await res.json();
	if (res.status !== 200) throw new Error(`preview: ${res.status} ${preview.error?.message}`);
	return { batchId: up.batchId, headers: up.headers, mapping: up.suggested, preview };
}

/** Commit a previewed draft; returns the response. */
export function commitRequest(
	client: Client,
	batchId: string,
	revision: number,
	allowReimport = false
): Promise<Response> {
	return client.json(`/api/v1/imports/${batchId}/commit`, { revision, allowReimport });
}

/** An invented CSV of n sites on a regular grid in decimal degrees (WGS 84). */
export function gridCsv(n: number, prefix: string, origin = { lon: -30, lat: -50 }): string {
	const lines = ['site_code;latitude;longitude;heat_flow_mw_m2;heat_flow_sigma_mw_m2;method'];
	const side = Math.ceil(Math.sqrt(n));
	for (let i = 0; i < n; i++) {
		const lat = origin.lat + Math.floor(i / side) * 0.01;
		const lon = origin.lon + (i % side) * 0.01;
		lines.push(
			`${prefix}-${i};${lat.toFixed(5).replace('.', ',')};${lon.toFixed(5).replace('.', ',')};${(60 + (i % 40)).toString()};6;bullard`
		);
	}
	return lines.join('\n') + '\n';
}

export async function waitForImport(client: Client, batchId: string) {
	for (let i = 0; i < 300; i++) {
		const res = await client.get(`/api/v1/imports/${batchId}`);
		const body = await res.json();
		if (body.status === 'done' || body.status === 'failed') return body;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error('import did not finish');
}

/** Upload, preview with the suggested mapping and commit: the whole wizard; returns the batch id. */
export async function importFile(
	client: Client,
	datasetId: string,
	fileName: string,
	content: string | Uint8Array,
	allowReimport = false
): Promise<string> {
	const { batchId, preview } = await uploadAndPreview(client, datasetId, fileName, content);
	const res = await commitRequest(client, batchId, preview.revision, allowReimport);
	if (res.status !== 202) throw new Error(`commit: ${res.status} ${await res.text()}`);
	return batchId;
}
