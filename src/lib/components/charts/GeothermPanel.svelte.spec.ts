import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import GeothermPanel from './GeothermPanel.svelte';

// Invented site; few samples keep the component tests quick.
const site = {
	heatFlowMWm2: 68,
	heatFlowSigmaMWm2: 5,
	conductivityWmK: 2.9,
	heatProductionUWm3: 1.8
};
const props = { site, siteName: 'Test bore 1', samples: 200 };

const input = (label: RegExp) => screen.getByLabelText(label) as HTMLInputElement;

describe('GeothermPanel', () => {
	it('shows the chart, key numbers, assumptions and the model caution', () => {
		render(GeothermPanel, props);
		expect(screen.getByRole('img')).toBeTruthy();
		expect(screen.getByTestId('isotherm-150').textContent).toMatch(
			/^\s*\d+\.\d \(\d+\.\d–\d+\.\d\) km\s*$/
		);
		expect(screen.getByTestId('isotherm-300').textContent).toContain('km');
		expect(screen.getByTestId('moho-temperature').textContent).toContain('°C');
		expect(screen.getByTestId('mantle-heat-flow').textContent).toContain('mW/m²');
		expect(screen.getByText(/Mantle \(basal\) heat flow/)).toBeTruthy();
		expect(screen.queryByText(/Reduced heat flow/i)).toBeNull();
		const assumptions = screen.getByTestId('geotherm-assumptions').textContent ?? '';
		expect(assumptions).toContain('Steady state');
		expect(assumptions).toContain('Surface temperature 10 °C: the site gives none');
		expect(screen.getByLabelText('Model estimate caution')).toBeTruthy();
	});

	it('shows the error for Moho depth 0 and recovers when fixed', async () => {
		render(GeothermPanel, props);
		await fireEvent.input(input(/Moho depth/), { target: { value: '0' } });
		expect(screen.getByRole('alert').textContent).toContain(
			'Moho depth (km) must be greater than 0 (you entered 0).'
		);
		expect(screen.getByRole('alert').textContent).not.toContain('mohoDepthKm');
		// The same sentence sits next to the field and describes it for screen readers.
		const described = input(/Moho depth/).getAttribute('aria-describedby')!;
		expect(document.getElementById(described)?.textContent).toBe(
			'Must be greater than 0 (you entered 0).'
		);
		expect(screen.queryByRole('img')).toBeNull();
		expect(input(/Moho depth/).getAttribute('aria-invalid')).toBe('true');
		await fireEvent.input(input(/Moho depth/), { target: { value: '30' } });
		expect(screen.queryByRole('alert')).toBeNull();
		expect(screen.getByRole('img')).toBeTruthy();
	});

	it('shows the error for a negative conductivity, from the form or the site, and recovers', async () => {
		const view = render(GeothermPanel, props);
		await fireEvent.input(input(/conductivity \(W\/m\/K\)/), { target: { value: '-2' } });
		expect(screen.getByRole('alert').textContent).toContain(
			'Upper-crust conductivity (W/m/K) must be greater than 0 (you entered \u22122).'
		);
		await fireEvent.input(input(/conductivity \(W\/m\/K\)/), { target: { value: '2.9' } });
		expect(screen.queryByRole('alert')).toBeNull();
		// A bad site value resets the form to it and is reported the same way.
		await view.rerender({ ...props, site: { ...site, conductivityWmK: -1 } });
		expect(screen.getByRole('alert').textContent).toContain('(you entered \u22121)');
		await view.rerender({ ...props, site: { ...site, conductivityWmK: 3 } });
		expect(screen.queryByRole('alert')).toBeNull();
		expect(input(/conductivity \(W\/m\/K\)/).value).toBe('3');
	});

	it('updates the Moho temperature when the Moho depth changes', async () => {
		render(GeothermPanel, props);
		const before = screen.getByTestId('moho-temperature').textContent;
		await fireEvent.input(input(/Moho depth/), { target: { value: '42' } });
		const after = screen.getByTestId('moho-temperature').textContent;
		expect(after).not.toBe(before);
		expect(parseFloat(after ?? '')).toBeGreaterThan(parseFloat(before ?? ''));
		expect(screen.getByTestId('geotherm-assumptions').textContent).toContain(
			'Moho at 42 km (entered)'
		);
	});

	it('adds a user isotherm and rejects a non-number', async () => {
		render(GeothermPanel, props);
		await fireEvent.input(input(/Extra isotherm/), { target: { value: '200' } });
		expect(screen.getByTestId('isotherm-200').textContent).toContain('km');
		await fireEvent.input(input(/Extra isotherm/), { target: { value: 'warm' } });
		expect(screen.getByRole('alert').textContent).toContain(
			'Extra isotherm (°C): Enter a number, such as 2.5 or 2,5.'
		);
		expect(input(/Extra isotherm/).getAttribute('aria-invalid')).toBe('true');
	});

	it('flags a heat production that is not a number next to its field', async () => {
		render(GeothermPanel, props);
		await fireEvent.input(input(/heat production/), { target: { value: 'abc' } });
		expect(input(/heat production/).getAttribute('aria-invalid')).toBe('true');
		const described = input(/heat production/).getAttribute('aria-describedby')!;
		expect(document.getElementById(described)?.textContent).toBe(
			'Enter a number, such as 2.5 or 2,5.'
		);
		expect(screen.queryByRole('img')).toBeNull();
	});

	it('reads a decimal comma', async () => {
		render(GeothermPanel, props);
		await fireEvent.input(input(/Moho depth/), { target: { value: '37,5' } });
		expect(screen.queryByRole('alert')).toBeNull();
		expect(screen.getByTestId('geotherm-assumptions').textContent).toContain(
			'Moho at 37.5 km (entered)'
		);
	});
});
