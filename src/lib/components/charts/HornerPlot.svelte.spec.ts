import { render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import HornerPlot from './HornerPlot.svelte';

// Invented readings on T = 120 − 10 ln((tc + Δt)/Δt), tc = 4 h (Horner 1951).
const readings = [4, 8, 16].map((dt) => ({
	shutInTimeH: dt,
	temperatureC: 120 - 10 * Math.log((4 + dt) / dt)
}));
const num = (el: Element, name: string) => Number(el.getAttribute(name));

describe('HornerPlot', () => {
	it('draws the readings and a fit that ends at ratio 1 on the right, with the formation temperature', () => {
		render(HornerPlot, { readings, circulationTimeH: 4 });
		const points = screen.getAllByTestId('horner-point');
		expect(points).toHaveLength(3);
		const fit = screen.getByTestId('horner-fit');
		// Ratio 1 (ln 0) is at the right end; the readings lie to its left, on the line.
		expect(num(fit, 'x1')).toBeGreaterThan(Math.max(...points.map((p) => num(p, 'cx'))));
		expect(num(fit, 'x2')).toBeCloseTo(num(points[0], 'cx'), 0);
		expect(num(fit, 'y2')).toBeCloseTo(num(points[0], 'cy'), 0);
		expect(screen.getByTestId('horner-summary').textContent).toContain('120.0 ± 0.0 °C at ratio 1');
	});

	it('shows the core’s message instead of a plot for unusable readings', () => {
		render(HornerPlot, { readings: [readings[0]], circulationTimeH: 4 });
		expect(screen.getByRole('alert').textContent).toMatch(/at least 2 bottom-hole temperatures/);
	});
});
