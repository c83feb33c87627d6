// Server-side render check (runs in the `server` project, Node, no DOM): the chart and the panel
// must render without `window` so a page can ship the geotherm in its first HTML.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { computeSiteGeotherm } from '$lib/chart-data';
import GeothermChart from './GeothermChart.svelte';
import GeothermPanel from './GeothermPanel.svelte';

describe('SSR: renders without a DOM, so a page can ship the geotherm in its first HTML', () => {
	it('renders the chart to HTML with the band, title and table', () => {
		const geotherm = computeSiteGeotherm({ heatFlowMWm2: 70 }, { samples: 100 });
		const { body } = render(GeothermChart, { props: { geotherm, title: 'SSR geotherm' } });
		expect(body).toContain('<title');
		expect(body).toContain('SSR geotherm');
		expect(body).toContain('data-testid="geotherm-band"');
		expect(body).toContain('150 °C at');
	});

	it('renders the panel to HTML', () => {
		const { body } = render(GeothermPanel, {
			props: { site: { heatFlowMWm2: 70 }, siteName: 'SSR bore', samples: 100 }
		});
		expect(body).toContain('Geotherm for SSR bore');
		expect(body).toContain('Model estimate');
	});
});
