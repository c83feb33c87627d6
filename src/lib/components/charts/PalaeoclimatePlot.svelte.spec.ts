import { render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import PalaeoclimatePlot from './PalaeoclimatePlot.svelte';

// Invented log, 10 °C + 25 K/km; a 2 °C warming 10 000 years ago (Carslaw & Jaeger 1959) makes the
// corrected log cooler than the measured one near the surface.
const depthM = [50, 100, 200, 400, 800];
const temperatureC = depthM.map((z) => 10 + 0.025 * z);

describe('PalaeoclimatePlot', () => {
	it('draws the measured and the corrected log and states both gradients', () => {
		render(PalaeoclimatePlot, {
			depthM,
			temperatureC,
			steps: [{ stepC: 2, ageYears: 10_000 }],
			diffusivityM2s: 1e-6
		});
		const measured = screen.getByTestId('palaeo-measured').getAttribute('d') ?? '';
		const corrected = screen.getByTestId('palaeo-corrected').getAttribute('d') ?? '';
		expect(measured.split(/[ML]/).filter(Boolean)).toHaveLength(5);
		expect(corrected).not.toBe(measured);
		// The first point: corrected is left of (cooler than) measured at the same depth.
		const x0 = (d: string) => Number(d.slice(1).split(',')[0]);
		expect(x0(corrected)).toBeLessThan(x0(measured));
		expect(screen.getByRole('img').querySelector('desc')?.textContent).toMatch(
			/Measured gradient 25\.00 K\/km, corrected \d+\.\d\d K\/km\./
		);
	});

	it('shows the core’s message for an impossible history', () => {
		render(PalaeoclimatePlot, {
			depthM,
			temperatureC,
			steps: [{ stepC: 2, ageYears: -5 }],
			diffusivityM2s: 1e-6
		});
		expect(screen.getByRole('alert').textContent).toMatch(/steps\[0\]\.ageYears/);
	});
});
