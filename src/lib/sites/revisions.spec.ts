import { describe, expect, it } from 'vitest';
import { pickSiteValues, revisionRows, type RevisionRecord, type SiteValues } from './revisions';

const submitted: SiteValues = {
	heatFlowMWm2: 62,
	heatFlowSigmaMWm2: 6,
	gradientKPerKm: 24.8,
	gradientSigmaKPerKm: null,
	conductivityWmK: 2.5,
	conductivitySigmaWmK: null,
	conductivitySamples: 4,
	topDepthM: 100,
	bottomDepthM: 900,
	method: 'borehole_interval'
};

const rec = (over: Partial<RevisionRecord>): RevisionRecord => ({
	...submitted,
	id: 'r-submitted',
	source: 'submitted',
	createdAt: '2026-01-05T08:00:00Z',
	createdByName: 'Ada Contributor',
	reason: null,
	importFileName: 'field-2025.csv',
	computation: null,
	...over
});

describe('revision list view model', () => {
	it('shows the site values as the current submitted ones while no revision is stored', () => {
		const rows = revisionRows({ ...submitted, createdAt: '2026-01-05T08:00:00Z' }, [], null);
		expect(rows).toHaveLength(1);
		expect(rows[0]).toMatchObject({
			id: null,
			label: 'As submitted',
			current: true,
			heatFlow: '62.0 ± 6.0 mW/m²',
			gradient: '24.8 K/km',
			conductivity: '2.50 W/(m·K)',
			interval: '100–900 m',
			method: 'Borehole, interval method'
		});
		expect(rows[0].provenance).toBe('Entered with the dataset, 2026-01-05 08:00 UTC.');
	});

	it('orders revisions oldest first, marks the chosen one, and says who, when and from what', () => {
		const revisions = [
			rec({
				id: 'r-fix',
				source: 'correction',
				heatFlowMWm2: 64,
				createdAt: '2026-03-01T10:30:00Z',
				reason: 'Units were HFU',
				importFileName: null
			}),
			rec({}),
			rec({
				id: 'r-log',
				source: 'log_computation',
				method: 'bullard',
				heatFlowMWm2: 71.25,
				heatFlowSigmaMWm2: 3.1,
				createdAt: '2026-02-01T09:00:00Z',
				importFileName: null,
				computation: { method: 'bullard', fromM: 150, toM: 850, logName: 'KV-12.las' }
			})
		];
		const rows = revisionRows(
			{ ...submitted, createdAt: '2026-01-05T08:00:00Z' },
			revisions,
			'r-log'
		);
		expect(rows.map((r) => r.id)).toEqual(['r-submitted', 'r-log', 'r-fix']);
		expect(rows.map((r) => r.current)).toEqual([false, true, false]);
		expect(rows[0].provenance).toBe(
			'Imported from field-2025.csv by Ada Contributor, 2026-01-05 08:00 UTC.'
		);
		expect(rows[1].provenance).toBe(
			'Computed by Ada Contributor with the Bullard method over 150–850 m of KV-12.las, 2026-02-01 09:00 UTC.'
		);
		expect(rows[1].heatFlow).toBe('71.3 ± 3.1 mW/m²');
		expect(rows[2].provenance).toMatch(
			/^Corrected by Ada Contributor, 2026-03-01 10:30 UTC\. Reason: Units were HFU$/
		);
	});

	it('takes the submitted revision as current when none was chosen', () => {
		const rows = revisionRows(
			{ ...submitted, createdAt: '2026-01-05T08:00:00Z' },
			[rec({ id: 'r-log', source: 'log_computation', createdAt: '2026-02-01T00:00:00Z' }), rec({})],
			null
		);
		expect(rows.find((r) => r.current)?.id).toBe('r-submitted');
	});

	it('picks exactly the revision columns from a site row', () => {
		const picked = pickSiteValues({ ...submitted, code: 'X', remarks: 'r' } as SiteValues);
		expect(picked).toEqual(submitted);
	});
});
