import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureGdal } from '../../scripts/lib/bench-gdal.js';
import { testEnv } from './env';
import { OPEN_IN_BOX, createOgcFixture, type OgcFixture } from './ogc-fixture';

/*
 * A real OGC API – Features client: GDAL's OAPIF driver (Debian gdal-bin, installed when missing
 * and we are root, as for the benchmarks). It reads the landing page, conformance and
 * collections, then pages through the items with its own requests, as QGIS and ArcGIS do.
 */

const run = promisify(execFile);
let fx: OgcFixture;
let dir: string;

beforeAll(async () => {
	const missing = await ensureGdal({ install: true });
	if (missing) throw new Error(missing);
	fx = await createOgcFixture();
	dir = mkdtempSync(path.join(tmpdir(), 'ogc-gdal-'));
}, 600_000);
afterAll(async () => {
	await fx?.close();
	if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('GDAL OAPIF driver as the client', () => {
	it('ogrinfo lists the collections an anonymous caller may see', async () => {
		const { stdout } = await run('ogrinfo', ['-ro', '-q', `OAPIF:${testEnv.appUrl()}/ogc`]);
		expect(stdout).toMatch(/\bsites\b/);
		expect(stdout).toContain(`dataset-${fx.open.dataset}`);
		expect(stdout).not.toContain(`dataset-${fx.hidden.dataset}`);
	});

	it('ogr2ogr copies every visible site in a box, across several pages, each once', async () => {
		const out = path.join(dir, 'sites.geojson');
		await run('ogr2ogr', [
			'-f',
			'GeoJSON',
			out,
			`OAPIF:${testEnv.appUrl()}/ogc`,
			'sites',
			'-oo',
			'PAGE_SIZE=5',
			'-spat',
			'140',
			'70',
			'141',
			'71'
		]);
		const copied = JSON.parse(readFileSync(out, 'utf8')) as {
			features: { properties: { id: string; heatFlowMWm2: number; licence: string } }[];
		};
		const ids = copied.features.map((f) => f.properties.id);
		expect(ids.length).toBe(OPEN_IN_BOX);
		expect([...ids].sort()).toEqual([...fx.open.sites].sort());
		expect(copied.features[0].properties.licence).toBe('CC-BY-4.0');
	});
});
