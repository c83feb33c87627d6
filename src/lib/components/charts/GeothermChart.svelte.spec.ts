import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import { computeSiteGeotherm } from '$lib/chart-data';
import GeothermChart from './GeothermChart.svelte';

// Invented site; 300 samples keep the component tests quick.
const geotherm = computeSiteGeotherm(
	{ heatFlowMWm2: 75, heatFlowSigmaMWm2: 6, conductivityWmK: 2.8, heatProductionUWm3: 2.2 },
	{ samples: 300 }
);

describe('GeothermChart', () => {
	it('has an accessible title and a description naming the 150 °C depth', () => {
		render(GeothermChart, { geotherm, title: 'Test geotherm' });
		const svg = screen.getByRole('img');
		expect(svg.querySelector('title')?.textContent).toBe('Test geotherm');
		const desc = svg.querySelector('desc')?.textContent ?? '';
		const iso150 = geotherm.isotherms[0];
		const km = ((iso150.p50M as number) / 1000).toFixed(1);
		expect(desc).toContain(`150 °C at ${km} (`);
		expect(desc).toContain('300 °C at');
		expect(desc).toContain('Moho temperature');
		// aria-labelledby points at the title and desc ids.
		const ids = (svg.getAttribute('aria-labelledby') ?? '').split(' ');
		expect(ids.map((id) => document.getElementById(id)?.tagName.toLowerCase())).toEqual([
			'title',
			'desc'
		]);
	});

	it('draws the P10–P90 band, the P50 and central lines and isotherm markers', () => {
		const { container } = render(GeothermChart, { geotherm });
		const band = screen.getByTestId('geotherm-band').getAttribute('d') ?? '';
		expect(band.startsWith('M')).toBe(true);
		expect(band.endsWith('Z')).toBe(true);
		// Down the P10 side and back up the P90 side: two points per depth.
		expect(band.split('L').length).toBe(2 * geotherm.depthM.length);
		expect(screen.getByTestId('geotherm-p50').getAttribute('d')).toMatch(/^M[\d.]+,[\d.]+L/);
		expect(screen.getByTestId('geotherm-deterministic')).toBeTruthy();
		expect(screen.getAllByTestId('isotherm-marker')).toHaveLength(2);
		expect(container.querySelector('svg')?.getAttribute('viewBox')).toBe('0 0 640 520');
		expect(container.textContent).toContain('Temperature (°C)');
		expect(container.textContent).toContain('Depth (km)');
	});

	it('has a values table with one row per kilometre, toggled by "Show values"', async () => {
		render(GeothermChart, { geotherm });
		const rows = screen.getByTestId('geotherm-table').querySelectorAll('tbody tr');
		expect(rows).toHaveLength(36); // 0…35 km
		expect(rows[10].querySelector('th')?.textContent).toBe('10');
		const button = screen.getByRole('button', { name: 'Show values' });
		expect(button.getAttribute('aria-expanded')).toBe('false');
		await fireEvent.click(button);
		expect(screen.getByRole('button', { name: 'Hide values' }).getAttribute('aria-expanded')).toBe(
			'true'
		);
	});

	it('says when an isotherm is not reached above a shallow Moho and draws no marker for it', () => {
		const shallow = computeSiteGeotherm({ heatFlowMWm2: 60 }, { samples: 200, mohoDepthKm: 8 });
		render(GeothermChart, { geotherm: shallow });
		const desc = screen.getByRole('img').querySelector('desc')?.textContent ?? '';
		expect(desc).toContain('300 °C not reached above the Moho');
		expect(desc).toContain('Moho at 8.0 km');
		expect(screen.getAllByTestId('isotherm-marker')).toHaveLength(1);
		expect(screen.getByTestId('geotherm-table').querySelectorAll('tbody tr')).toHaveLength(9);
	});
});
