/**
 * The site panel's geotherm (2,000 Monte Carlo samples, 250 m steps to the Moho) is recomputed on
 * every input change in the browser; it should stay well under 100 ms to feel instant.
 */
import { computeSiteGeotherm } from '../src/lib/chart-data';
import { figure, size } from './report';

const runs = size(20, 1);
computeSiteGeotherm({ heatFlowMWm2: 70 }); // warm-up
const times: number[] = [];
for (let i = 0; i < runs; i++) {
	const t0 = performance.now();
	computeSiteGeotherm(
		{ heatFlowMWm2: 60 + i, conductivityWmK: 2.6 },
		{ temperatureDependentConductivity: true }
	);
	times.push(performance.now() - t0);
}
times.sort((a, b) => a - b);
figure({
	id: 'site-geotherm.panel',
	label: 'Site geotherm panel (2,000 samples, redrawn on every input change)',
	value: times[Math.floor(runs / 2)],
	unit: 'ms',
	target: 100,
	better: 'lower',
	note: `median of ${runs}`
});
