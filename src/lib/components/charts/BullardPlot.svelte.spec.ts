import { fireEvent, render, screen } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import BullardPlot from './BullardPlot.svelte';

// Invented log, exactly linear in thermal resistance (k = 2.0 W/m/K above 500 m, 4.0 below,
// q = 80 mW/m², T = 15 °C at 100 m), so every point lies on the Bullard line (Bullard 1939).
const depthM = [100, 200, 300, 400, 500, 600, 700, 800, 900, 1000];
const rM2KW = (z: number) => (z <= 500 ? (z - 100) / 2 : 200 + (z - 500) / 4);
const log = {
	depthM,
	temperatureC: depthM.map((z) => 15 + 0.08 * rM2KW(z)),
	conductivity: [
		{ topM: 0, bottomM: 500, conductivityWmK: 2.0 },
		{ topM: 500, bottomM: 1100, conductivityWmK: 4.0 }
	]
};

const num = (el: Element, name: string) => Number(el.getAttribute(name));

describe('BullardPlot', () => {
	it('draws one point per used log point and a fitted line from the first to the last point (invented log)', () => {
		render(BullardPlot, { log });
		const points = screen.getAllByTestId('bullard-point');
		expect(points).toHaveLength(10);
		const fit = screen.getByTestId('bullard-fit');
		// The log is exactly linear in R and R = 0 at the first point, so the line ends on the points.
		expect(num(fit, 'x1')).toBeCloseTo(num(points[0], 'cx'), 0);
		expect(num(fit, 'y1')).toBeCloseTo(num(points[0], 'cy'), 0);
		expect(num(fit, 'x2')).toBeCloseTo(num(points[9], 'cx'), 0);
		expect(num(fit, 'y2')).toBeCloseTo(num(points[9], 'cy'), 0);
		expect(screen.getByTestId('bullard-summary').textContent).toContain('80.0 ± ');
		expect(screen.getByRole('img').querySelector('desc')?.textContent).toContain(
			'Bullard plot of 10 log points'
		);
		// Residuals of an exact line all sit on the zero line of the residual strip, one per point.
		const residuals = screen.getAllByTestId('bullard-residual');
		expect(residuals).toHaveLength(10);
		const zero = num(residuals[0], 'cx');
		for (const p of residuals) expect(num(p, 'cx')).toBeCloseTo(zero, 0);
		expect(residuals.map((p) => num(p, 'cy'))).toEqual(points.map((p) => num(p, 'cy')));
	});

	it('switches to temperature against depth with the fitted gradient line', async () => {
		render(BullardPlot, { log });
		await fireEvent.click(screen.getByRole('button', { name: 'Against depth' }));
		expect(screen.getByRole('button', { name: 'Against depth' }).getAttribute('aria-pressed')).toBe(
			'true'
		);
		const points = screen.getAllByTestId('bullard-point');
		expect(points).toHaveLength(10);
		const fit = screen.getByTestId('bullard-fit');
		// The line spans the depth range of the points (first to last depth).
		expect(num(fit, 'y1')).toBeCloseTo(num(points[0], 'cy'), 0);
		expect(num(fit, 'y2')).toBeCloseTo(num(points[9], 'cy'), 0);
		expect(screen.getByRole('img').textContent).toContain('Depth (km)');
		expect(screen.getByTestId('bullard-summary').textContent).toContain('K/km');
	});

	it('shows the core error for a log the fit cannot use (thermal core rules)', () => {
		render(BullardPlot, { log: { ...log, fromM: 950 } });
		expect(screen.getByRole('alert').textContent).toContain('at least 3 log points');
	});
});
