import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it, vi } from 'vitest';
import type { SiteFeatureProperties } from '$lib/sites/summary';
import SitePanel from './SitePanel.svelte';

const site: SiteFeatureProperties = {
	id: '0b7c6a3e-0000-4000-8000-000000000007',
	code: 'KGS-007',
	name: 'Holmby borehole',
	heatFlowMWm2: 71.26,
	heatFlowSigmaMWm2: 6.04,
	method: 'bullard',
	qualityClass: 'constrained',
	yearMeasured: 1987,
	datasetTitle: 'Demo set',
	organisationName: 'Demo Survey'
};

describe('SitePanel', () => {
	it('shows heat flow with its uncertainty, the method and the quality class in words', () => {
		render(SitePanel, { site, lonLat: [8.12345, 59.5], onclose: () => {} });
		expect(screen.getByRole('heading').textContent).toBe('Holmby borehole');
		const panel = screen.getByTestId('site-panel').textContent ?? '';
		expect(panel).toContain('71.3');
		expect(panel).toContain('± 6.0 mW/m²');
		expect(panel).toContain('Borehole, Bullard method');
		expect(panel).toContain('Constrained');
		expect(panel).toContain('59.5000° N, 8.1235° E');
		expect(screen.getByRole('link', { name: /Open the site/ }).getAttribute('href')).toBe(
			'/sites/0b7c6a3e-0000-4000-8000-000000000007'
		);
	});

	it('shows dashes for missing values and calls onclose from the close button', async () => {
		const onclose = vi.fn();
		render(SitePanel, {
			site: {
				...site,
				name: null,
				heatFlowMWm2: null,
				heatFlowSigmaMWm2: null,
				qualityClass: null
			},
			lonLat: [0, 0],
			onclose
		});
		expect(screen.getByRole('heading').textContent).toBe('KGS-007');
		expect(screen.getByTestId('site-panel').textContent).toContain('— ± — mW/m²');
		await fireEvent.click(screen.getByRole('button', { name: 'Close site panel' }));
		expect(onclose).toHaveBeenCalledOnce();
	});
});
