/**
 * The invented demo scenario: the Korvald Basin, an imaginary sedimentary basin with a granite
 * massif on its eastern flank and a shelf sea to the west. Organisations, people, places and every
 * value are made up for demonstration; none of it is real data. Values follow the plausibility
 * ranges in docs/science.md#plausibility-limits (continental heat flow around 65 mW/m², higher
 * over the granite).
 */
import type { NewDataset, NewOrganisation, NewSite } from '../../src/lib/server/db/schema';
import { createRandom } from '../../src/lib/foundation/random';
import { qualityClass, type QualityMethod } from '../../src/lib/sites/quality';

export const DEMO_NOTICE = 'Invented demonstration data: not a real measurement.';

export const organisations: NewOrganisation[] = [
	{
		id: 'org-korvald-survey',
		name: 'Korvald Geological Survey',
		slug: 'korvald-survey',
		country: 'Korvald (invented)',
		website: 'https://korvald-survey.example',
		description:
			'The (invented) national survey of Korvald, publishing its borehole heat-flow archive.'
	},
	{
		id: 'org-lindmark-thermics',
		name: 'Lindmark University Crustal Thermics Group',
		slug: 'lindmark-thermics',
		country: 'Korvald (invented)',
		website: 'https://thermics.lindmark.example',
		description: 'An (invented) university group measuring conductivity and marine heat flow.'
	},
	{
		id: 'org-skarnholt',
		name: 'Skarnholt Drilling & Exploration',
		slug: 'skarnholt',
		country: 'Korvald (invented)',
		website: 'https://skarnholt.example',
		description: 'An (invented) exploration company with bottom-hole temperatures from its wells.'
	}
];

export const datasets: (NewDataset & { key: string })[] = [
	{
		key: 'survey',
		id: '5a0c1d3e-0000-4000-8000-000000000001',
		organisationId: 'org-korvald-survey',
		title: 'Korvald Basin borehole heat flow, 1978–2024',
		abstract:
			'Heat flow from equilibrium temperature logs and core conductivity in survey boreholes across the Korvald Basin. ' +
			DEMO_NOTICE,
		keywords: ['heat flow', 'borehole', 'Korvald Basin'],
		licence: 'CC-BY-4.0',
		citation:
			'Korvald Geological Survey (2025). Korvald Basin borehole heat flow, version 3. Thermalith demo.',
		version: 3,
		status: 'published',
		visibility: 'public'
	},
	{
		key: 'marine',
		id: '5a0c1d3e-0000-4000-8000-000000000002',
		organisationId: 'org-lindmark-thermics',
		title: 'Western shelf marine heat-flow probes',
		abstract:
			'Gravity-corer probe measurements on the western shelf of the Korvald Sea. ' + DEMO_NOTICE,
		keywords: ['marine heat flow', 'probe'],
		licence: 'CC0-1.0',
		citation:
			'Lindmark Crustal Thermics Group (2024). Western shelf marine heat-flow probes. Thermalith demo.',
		version: 1,
		status: 'published',
		visibility: 'public'
	},
	{
		key: 'wells',
		id: '5a0c1d3e-0000-4000-8000-000000000003',
		organisationId: 'org-skarnholt',
		title: 'Eastern flank exploration wells (corrected BHT)',
		abstract: 'Horner-corrected bottom-hole temperatures from exploration wells. ' + DEMO_NOTICE,
		keywords: ['bottom-hole temperature', 'exploration'],
		licence: 'proprietary',
		citation: 'Skarnholt Drilling & Exploration (2026). Eastern flank wells. Thermalith demo.',
		version: 1,
		status: 'published',
		visibility: 'embargoed',
		// Always six months after seeding, so the demo keeps one dataset under embargo.
		embargoUntil: new Date(Date.now() + 182 * 86_400_000).toISOString().slice(0, 10)
	},
	{
		// Waiting for a curator, so the demo curator has something to review (no sites yet, so
		// the public figures above do not change).
		key: 'review',
		id: '5a0c1d3e-0000-4000-8000-000000000004',
		organisationId: 'org-korvald-survey',
		title: 'Korvald Basin shallow boreholes, 2025 campaign',
		abstract:
			'Temperature logs of the 2025 shallow drilling campaign, awaiting review. ' + DEMO_NOTICE,
		keywords: ['heat flow', 'shallow boreholes'],
		licence: 'CC-BY-4.0',
		version: 1,
		status: 'in_review',
		visibility: 'public'
	}
];

/** The invented heat-flow field: a westward rise to the shelf plus a granite high in the east. */
function fieldMWm2(lon: number, lat: number): number {
	const granite = 34 * Math.exp(-(((lon - 9.4) / 0.5) ** 2 + ((lat - 59.6) / 0.4) ** 2));
	return 58 + 4 * (8 - lon) + 3 * (lat - 58) + granite;
}

const PLACE_PARTS = [
	'Ask',
	'Bræ',
	'Dal',
	'Fjell',
	'Grøn',
	'Holm',
	'Kvarn',
	'Lyng',
	'Mo',
	'Nes',
	'Ros',
	'Stein',
	'Tind',
	'Vik'
];
const PLACE_ENDS = ['by', 'ås', 'vollen', 'heim', 'rud', 'set', 'stad', 'myr'];

interface SiteSpec {
	datasetKey: string;
	prefix: string;
	count: number;
	box: [number, number, number, number]; // lon min, lat min, lon max, lat max
	method: QualityMethod;
	marine?: boolean;
}

const SPECS: SiteSpec[] = [
	{
		datasetKey: 'survey',
		prefix: 'KGS',
		count: 30,
		box: [6.6, 57.9, 10.6, 60.0],
		method: 'bullard'
	},
	{
		datasetKey: 'marine',
		prefix: 'WSP',
		count: 12,
		box: [4.3, 57.4, 5.3, 59.6],
		method: 'marine_probe',
		marine: true
	},
	{
		datasetKey: 'wells',
		prefix: 'SKH',
		count: 8,
		box: [9.0, 59.2, 9.9, 60.0],
		method: 'bottom_hole_temperature'
	}
];

export function demoSites(datasetIds: Record<string, string>): NewSite[] {
	// The project's one seeded generator, so the scenario is the same on every machine.
	const random = createRandom(20261201).uniform;
	const sites: NewSite[] = [];
	for (const spec of SPECS) {
		for (let i = 1; i <= spec.count; i++) {
			const [x0, y0, x1, y1] = spec.box;
			const lon = round(x0 + random() * (x1 - x0), 4);
			const lat = round(y0 + random() * (y1 - y0), 4);
			const heatFlow = round(fieldMWm2(lon, lat) * (0.93 + random() * 0.14), 1);
			const relSigma =
				spec.method === 'bottom_hole_temperature' ? 0.18 + random() * 0.12 : 0.05 + random() * 0.12;
			const conductivity = round(spec.marine ? 0.9 + random() * 0.4 : 2.1 + random() * 1.3, 2);
			const gradient = round(heatFlow / conductivity, 1);
			const samples = spec.marine ? 0 : Math.floor(2 + random() * 20);
			const top = spec.marine ? 0 : Math.round(100 + random() * 300);
			const bottom = spec.marine ? 4 : Math.round(top + 400 + random() * 2200);
			const sigma = round(heatFlow * relSigma, 1);
			const name = spec.marine
				? `Shelf station ${spec.prefix}-${String(i).padStart(2, '0')}`
				: `${PLACE_PARTS[Math.floor(random() * PLACE_PARTS.length)]}${PLACE_ENDS[Math.floor(random() * PLACE_ENDS.length)]} ${spec.method === 'bottom_hole_temperature' ? 'well' : 'borehole'}`;
			sites.push({
				datasetId: datasetIds[spec.datasetKey],
				code: `${spec.prefix}-${String(i).padStart(3, '0')}`,
				name,
				location: { lon, lat },
				originalX: lon,
				originalY: lat,
				originalEpsg: 4326,
				elevationM: spec.marine ? null : Math.round(20 + random() * 600),
				waterDepthM: spec.marine ? Math.round(80 + random() * 260) : null,
				topDepthM: top,
				bottomDepthM: bottom,
				heatFlowMWm2: heatFlow,
				heatFlowSigmaMWm2: sigma,
				gradientKPerKm: gradient,
				gradientSigmaKPerKm: round(gradient * relSigma * 0.8, 1),
				conductivityWmK: conductivity,
				conductivitySigmaWmK: round(conductivity * 0.06, 2),
				conductivitySamples: samples,
				conductivityMethod: spec.marine ? 'needle probe, in situ' : 'divided bar on core',
				heatProductionUWm3: spec.marine
					? null
					: round(lon > 9 ? 2.4 + random() * 1.4 : 0.8 + random() * 1.0, 2),
				heatProductionSigmaUWm3: spec.marine ? null : 0.3,
				surfaceTemperatureC: spec.marine ? 6.5 : round(5 + random() * 3, 1),
				method: spec.method,
				corrections: spec.marine ? ['sedimentation'] : ['topographic', 'palaeoclimatic'],
				yearMeasured: 1978 + Math.floor(random() * 47),
				remarks: DEMO_NOTICE,
				qualityClass: qualityClass({
					heatFlowMWm2: heatFlow,
					heatFlowSigmaMWm2: sigma,
					method: spec.method,
					conductivitySamples: samples
				})
			});
		}
	}
	return sites;
}

function round(value: number, digits: number): number {
	const f = 10 ** digits;
	return Math.round(value * f) / f;
}
