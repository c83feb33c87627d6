import { createHash } from 'node:crypto';
import { expect } from 'vitest';
import { parseCsv, suggestMapping } from '../../src/lib/imports';
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

/** The JSON the upload wizard sends for a CSV text, with the suggested mapping. */
export function importPayload(fileName: string, csv: string, extra: Record<string, unknown> = {}) {
	const table = parseCsv(csv);
	return {
		fileName,
		sha256: createHash('sha256').update(csv).digest('hex'),
		table,
		mapping: suggestMapping(table.headers),
		epsg: 4326,
		...extra
	};
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
		if (body.status !== 'running') return body;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error('import did not finish');
}
