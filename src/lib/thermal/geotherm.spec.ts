import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../foundation/errors';
import { solveGeotherm } from './geotherm';
import type { CrustLayer, GeothermInput } from './types';
import { expectClose, thrown } from '../foundation/testing';

const uniform10km: GeothermInput = {
	surfaceTemperatureC: 10,
	surfaceHeatFlowMWm2: 60,
	layers: [{ thicknessM: 10_000, conductivityWmK: 2.5, heatProductionUWm3: 1 }]
};

describe('closed forms (Turcotte & Schubert ch. 4; Lachenbruch 1970; Carslaw & Jaeger 1959)', () => {
	it('matches the worked check of docs/science.md#steady-conduction: 230 °C and 50 mW/m² at 10 km (Turcotte & Schubert ch. 4)', () => {
		const p = solveGeotherm(uniform10km);
		expectClose(p.temperatureC.at(-1)!, 230, { abs: 1e-9 }, 'T(10 km)');
		expectClose(p.heatFlowMWm2.at(-1)!, 50, { abs: 1e-9 }, 'q(10 km)');
		expectClose(p.basalHeatFlowMWm2, 50, { abs: 1e-9 }, 'basal');
		// Mid-depth by hand: 10 + 0.06·5000/2.5 − 1e-6·5000²/5 = 10 + 120 − 5 = 125 °C.
		expectClose(p.temperatureC[50], 125, { abs: 1e-9 }, 'T(5 km)');
		expect(p.depthM[50]).toBe(5000);
	});

	it('gives the same profile from the basal condition: q0 = qb + A L (Turcotte & Schubert ch. 4)', () => {
		const p = solveGeotherm({
			...uniform10km,
			surfaceHeatFlowMWm2: undefined,
			basalHeatFlowMWm2: 50
		});
		expectClose(p.surfaceHeatFlowMWm2, 60, { abs: 1e-12 }, 'q0');
		expectClose(p.temperatureC.at(-1)!, 230, { abs: 1e-9 }, 'T(10 km)');
	});

	it('solves exponential decay: invented case hand-computed from Lachenbruch (1970)', () => {
		// T0 = 0, q0 = 80 mW/m², k = 2, A0 = 3 µW/m³, hr = 10 km; at z = 10 km:
		// T = (0.08 − 0.03)·1e4/2 + (3e-6·1e8/2)(1 − e⁻¹) = 250 + 150·0.6321205588 = 344.8180838 °C,
		// q = 0.08 − 0.03(1 − e⁻¹) = 61.0363833 mW/m².
		const p = solveGeotherm({
			surfaceTemperatureC: 0,
			surfaceHeatFlowMWm2: 80,
			layers: [
				{
					thicknessM: 10_000,
					conductivityWmK: 2,
					heatProductionUWm3: 3,
					heatProductionDecayM: 10_000
				}
			]
		});
		expectClose(p.temperatureC.at(-1)!, 344.8180838, { abs: 1e-6 }, 'T');
		expectClose(p.heatFlowMWm2.at(-1)!, 61.0363833, { abs: 1e-6 }, 'q');
	});

	it('follows the exponential formula at every sample, also from a basal condition (Lachenbruch 1970)', () => {
		const [t0, k, a0, hr, L, qb] = [5, 3.1, 2.4e-6, 8000, 35_000, 0.03];
		const q0 = qb + a0 * hr * (1 - Math.exp(-L / hr));
		const p = solveGeotherm({
			surfaceTemperatureC: t0,
			basalHeatFlowMWm2: qb * 1e3,
			depthStepM: 700,
			layers: [
				{
					thicknessM: L,
					conductivityWmK: k,
					heatProductionUWm3: a0 * 1e6,
					heatProductionDecayM: hr
				}
			]
		});
		expectClose(p.surfaceHeatFlowMWm2, q0 * 1e3, { rel: 1e-12 }, 'q0');
		p.depthM.forEach((z, i) => {
			const t = t0 + ((q0 - a0 * hr) * z) / k + ((a0 * hr * hr) / k) * (1 - Math.exp(-z / hr));
			const q = q0 - a0 * hr * (1 - Math.exp(-z / hr));
			expectClose(p.temperatureC[i], t, { abs: 1e-9, rel: 1e-12 }, `T(${z})`);
			expectClose(p.heatFlowMWm2[i], q * 1e3, { abs: 1e-9 }, `q(${z})`);
		});
	});

	it('passes T and q across layers: invented two-layer case by hand (Chapman 1986)', () => {
		// Layer 1: 10 km, k 3, A 2: q = 70 − 20 = 50; T = 10 + 0.07·1e4/3 − 2e-6·1e8/6 = 210 °C.
		// Layer 2: 20 km, k 2, A 0.5: q = 50 − 10 = 40; T = 210 + 0.05·2e4/2 − 0.5e-6·4e8/4 = 660 °C.
		const p = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 70,
			depthStepM: 1000,
			layers: [
				{ thicknessM: 10_000, conductivityWmK: 3, heatProductionUWm3: 2 },
				{ thicknessM: 20_000, conductivityWmK: 2, heatProductionUWm3: 0.5 }
			]
		});
		const i10 = p.depthM.indexOf(10_000);
		expectClose(p.temperatureC[i10], 210, { abs: 1e-9 }, 'T(10 km)');
		expectClose(p.heatFlowMWm2[i10], 50, { abs: 1e-9 }, 'q(10 km)');
		expectClose(p.temperatureC.at(-1)!, 660, { abs: 1e-9 }, 'T(30 km)');
		expectClose(p.basalHeatFlowMWm2, 40, { abs: 1e-9 }, 'qb');
		expect(p.layerBaseDepthsM).toEqual([10_000, 30_000]);
	});

	it('solves k(T) = k0/(1 + bT) by the Kirchhoff transform (Carslaw & Jaeger)', () => {
		// A = 0, k0 = 3, b = 1e-3, q = 60 mW/m², T0 = 0: U = q z/k0, so at 30 km U = 600 °C and
		// T = (e^0.6 − 1)/1e-3 = 822.1188 °C (e^0.6 = 1.8221188, A&S Table 4.4, from memory).
		const p = solveGeotherm({
			surfaceTemperatureC: 0,
			surfaceHeatFlowMWm2: 60,
			layers: [
				{
					thicknessM: 30_000,
					conductivityWmK: 3,
					heatProductionUWm3: 0,
					conductivityTempCoeffPerK: 1e-3
				}
			]
		});
		expectClose(p.temperatureC.at(-1)!, 822.1188, { abs: 1e-3 }, 'T(30 km)');
	});

	it("obeys Fourier's law q = k(T) dT/dz with heat production, decay and k(T) combined (Turcotte & Schubert ch. 4; Carslaw & Jaeger)", () => {
		const layer: CrustLayer = {
			thicknessM: 40_000,
			conductivityWmK: 2.8,
			heatProductionUWm3: 2.5,
			heatProductionDecayM: 9000,
			conductivityTempCoeffPerK: 8e-4
		};
		const p = solveGeotherm({
			surfaceTemperatureC: 8,
			surfaceHeatFlowMWm2: 75,
			depthStepM: 1,
			layers: [layer]
		});
		for (const i of [1000, 15_000, 39_000]) {
			const dTdz = (p.temperatureC[i + 1] - p.temperatureC[i - 1]) / 2;
			const k = layer.conductivityWmK / (1 + layer.conductivityTempCoeffPerK! * p.temperatureC[i]);
			expectClose(k * dTdz * 1e3, p.heatFlowMWm2[i], { rel: 1e-6 }, `q(${i} m)`);
		}
	});

	it('reduces to the constant-k result as b → 0 (limit case)', () => {
		const base: CrustLayer = { thicknessM: 30_000, conductivityWmK: 2.5, heatProductionUWm3: 1.2 };
		const exact = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 65,
			layers: [base]
		});
		const near = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 65,
			layers: [{ ...base, conductivityTempCoeffPerK: 1e-12 }]
		});
		near.temperatureC.forEach((t, i) =>
			expectClose(t, exact.temperatureC[i], { abs: 1e-6 }, `T[${i}]`)
		);
	});

	it('reduces to the uniform result as the decay length → ∞ (limit case)', () => {
		const base: CrustLayer = { thicknessM: 30_000, conductivityWmK: 2.5, heatProductionUWm3: 1.2 };
		const exact = solveGeotherm({
			surfaceTemperatureC: 10,
			surfaceHeatFlowMWm2: 65,
			layers: [base]
		});
		// A finite decay h changes T by about A z³/(6 k h): 2e-9 °C for h = 1e15 m, so 1e-6 is a fair bound.
		for (const decay of [1e15, Infinity]) {
			const near = solveGeotherm({
				surfaceTemperatureC: 10,
				surfaceHeatFlowMWm2: 65,
				layers: [{ ...base, heatProductionDecayM: decay }]
			});
			near.temperatureC.forEach((t, i) =>
				expectClose(t, exact.temperatureC[i], { abs: 1e-6 }, `T[${i}]`)
			);
			near.heatFlowMWm2.forEach((q, i) =>
				expectClose(q, exact.heatFlowMWm2[i], { abs: 1e-9 }, `q[${i}]`)
			);
		}
	});
});

describe('sampling', () => {
	it('samples every multiple of the step, every boundary and the base, once each', () => {
		const p = solveGeotherm({
			surfaceTemperatureC: 0,
			surfaceHeatFlowMWm2: 50,
			depthStepM: 100,
			layers: [
				{ thicknessM: 1050, conductivityWmK: 2, heatProductionUWm3: 1 },
				{ thicknessM: 950, conductivityWmK: 2, heatProductionUWm3: 1 },
				{ thicknessM: 525, conductivityWmK: 2, heatProductionUWm3: 1 }
			]
		});
		const expected = [...Array.from({ length: 26 }, (_, i) => i * 100), 1050, 2525].sort(
			(a, b) => a - b
		);
		expect(p.depthM).toEqual(expected);
		expect(p.temperatureC).toHaveLength(expected.length);
		expect(p.heatFlowMWm2).toHaveLength(expected.length);
	});

	it('does not duplicate a multiple that rounds onto a boundary (0.1 m steps)', () => {
		const p = solveGeotherm({
			surfaceTemperatureC: 0,
			surfaceHeatFlowMWm2: 50,
			depthStepM: 0.1,
			layers: [
				{ thicknessM: 0.3, conductivityWmK: 2, heatProductionUWm3: 1 },
				{ thicknessM: 0.4, conductivityWmK: 2, heatProductionUWm3: 1 }
			]
		});
		expect(p.depthM).toHaveLength(8);
		expect(p.depthM[3]).toBe(0.3);
		for (let i = 1; i < p.depthM.length; i++) expect(p.depthM[i]).toBeGreaterThan(p.depthM[i - 1]);
	});
});

describe('warnings (plausibility limits: common practice, no source)', () => {
	it('allows but flags a basal heat flow that makes the surface heat flow negative', () => {
		const p = solveGeotherm({
			...uniform10km,
			surfaceHeatFlowMWm2: undefined,
			basalHeatFlowMWm2: -20
		});
		expectClose(p.surfaceHeatFlowMWm2, -10, { abs: 1e-12 }, 'q0');
		expect(p.warnings?.some((w) => w.includes('negative'))).toBe(true);
	});

	it('flags heat flow turning negative at depth and implausibly high surface heat flow (common practice, no source)', () => {
		const low = solveGeotherm({ ...uniform10km, surfaceHeatFlowMWm2: 5 });
		expect(low.warnings?.some((w) => w.includes('negative at depth'))).toBe(true);
		const high = solveGeotherm({ ...uniform10km, surfaceHeatFlowMWm2: 600 });
		expect(high.warnings?.some((w) => w.includes('implausible'))).toBe(true);
		expect(solveGeotherm(uniform10km).warnings).toEqual([]);
	});
});

describe('bad input', () => {
	const layer = uniform10km.layers[0];
	const cases: [string, GeothermInput, string][] = [
		[
			'zero thickness',
			{ ...uniform10km, layers: [{ ...layer, thicknessM: 0 }] },
			'layers[0].thicknessM'
		],
		[
			'negative conductivity',
			{ ...uniform10km, layers: [layer, { ...layer, conductivityWmK: -1 }] },
			'layers[1].conductivityWmK'
		],
		[
			'negative heat production',
			{ ...uniform10km, layers: [{ ...layer, heatProductionUWm3: -0.1 }] },
			'layers[0].heatProductionUWm3'
		],
		[
			'NaN conductivity',
			{ ...uniform10km, layers: [{ ...layer, conductivityWmK: NaN }] },
			'layers[0].conductivityWmK'
		],
		[
			'infinite thickness',
			{ ...uniform10km, layers: [{ ...layer, thicknessM: Infinity }] },
			'layers[0].thicknessM'
		],
		[
			'NaN surface temperature',
			{ ...uniform10km, surfaceTemperatureC: NaN },
			'surfaceTemperatureC'
		],
		[
			'infinite heat flow',
			{ ...uniform10km, surfaceHeatFlowMWm2: Infinity },
			'surfaceHeatFlowMWm2'
		],
		[
			'both heat flows',
			{ ...uniform10km, basalHeatFlowMWm2: 40 },
			'surfaceHeatFlowMWm2/basalHeatFlowMWm2'
		],
		[
			'neither heat flow',
			{ ...uniform10km, surfaceHeatFlowMWm2: undefined },
			'surfaceHeatFlowMWm2'
		],
		['no layers', { ...uniform10km, layers: [] }, 'layers'],
		[
			'zero decay length',
			{ ...uniform10km, layers: [{ ...layer, heatProductionDecayM: 0 }] },
			'layers[0].heatProductionDecayM'
		],
		[
			'negative b',
			{ ...uniform10km, layers: [{ ...layer, conductivityTempCoeffPerK: -1e-3 }] },
			'layers[0].conductivityTempCoeffPerK'
		],
		['zero step', { ...uniform10km, depthStepM: 0 }, 'depthStepM'],
		['absurdly fine step', { ...uniform10km, depthStepM: 1e-6 }, 'depthStepM'],
		[
			'1 + bT <= 0 at the surface',
			{
				...uniform10km,
				surfaceTemperatureC: -2000,
				layers: [{ ...layer, conductivityTempCoeffPerK: 1e-3 }]
			},
			'surfaceTemperatureC'
		]
	];
	it.each(cases)('throws a InputError naming the field: %s', (_, input, field) => {
		const e = thrown(() => solveGeotherm(input));
		expect(e).toBeInstanceOf(InputError);
		expect(e.field).toBe(field);
		expect(e.message).toContain(field);
	});

	it('puts the bad value in the message', () => {
		const e = thrown(() =>
			solveGeotherm({ ...uniform10km, layers: [{ ...layer, thicknessM: -250 }] })
		);
		expect(e.message).toContain('-250');
		expect(
			thrown(() => solveGeotherm({ ...uniform10km, surfaceTemperatureC: NaN })).message
		).toContain('NaN');
	});
});

// Random valid models: 1–4 layers, optional decay and b (property tests, common practice, no source).
const layerArb = fc.record({
	thicknessM: fc.double({ min: 100, max: 40_000, noNaN: true }),
	conductivityWmK: fc.double({ min: 0.5, max: 6, noNaN: true }),
	heatProductionUWm3: fc.double({ min: 0, max: 5, noNaN: true }),
	heatProductionDecayM: fc.option(fc.double({ min: 500, max: 50_000, noNaN: true }), {
		nil: undefined
	}),
	conductivityTempCoeffPerK: fc.option(fc.double({ min: 0, max: 2e-3, noNaN: true }), {
		nil: undefined
	})
});
const modelArb = fc.record({
	surfaceTemperatureC: fc.double({ min: -20, max: 40, noNaN: true }),
	basalHeatFlowMWm2: fc.double({ min: 1, max: 120, noNaN: true }),
	layers: fc.array(layerArb, { minLength: 1, maxLength: 4 }),
	depthStepM: fc.constantFrom(250, 1000, 2500)
});

function simpsonProductionWm2(layers: CrustLayer[], toM: number): number {
	// Independent quadrature of A(z) (composite Simpson, 20,000 panels per layer).
	let total = 0;
	let top = 0;
	for (const l of layers) {
		const bottom = Math.min(top + l.thicknessM, toM);
		if (bottom > top) {
			const a = (z: number) =>
				l.heatProductionUWm3 *
				1e-6 *
				(l.heatProductionDecayM ? Math.exp(-(z - top) / l.heatProductionDecayM) : 1);
			const n = 20_000;
			const h = (bottom - top) / n;
			let s = a(top) + a(bottom);
			for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * a(top + i * h);
			total += (s * h) / 3;
		}
		top += l.thicknessM;
	}
	return total;
}

describe("properties over random valid models (energy balance and Fourier's law, Turcotte & Schubert ch. 4)", () => {
	it('temperature increases with depth when A >= 0 and q(base) > 0', () => {
		fc.assert(
			fc.property(modelArb, (m) => {
				const p = solveGeotherm(m);
				for (let i = 1; i < p.temperatureC.length; i++) {
					expect(p.temperatureC[i]).toBeGreaterThan(p.temperatureC[i - 1]);
				}
			}),
			{ numRuns: 200 }
		);
	});

	it('conserves energy: q0 − q(z) equals the integrated heat production (dq/dz = −A)', () => {
		fc.assert(
			fc.property(modelArb, (m) => {
				const p = solveGeotherm(m);
				for (const i of [Math.floor(p.depthM.length / 3), p.depthM.length - 1]) {
					const produced = simpsonProductionWm2(m.layers, p.depthM[i]) * 1e3;
					expectClose(
						p.surfaceHeatFlowMWm2 - p.heatFlowMWm2[i],
						produced,
						{ abs: 1e-9, rel: 1e-8 },
						'Δq'
					);
				}
			}),
			{ numRuns: 100 }
		);
	});

	it('surface and basal conditions are consistent: solving from either gives the same profile', () => {
		fc.assert(
			fc.property(modelArb, (m) => {
				const fromBase = solveGeotherm(m);
				const fromTop = solveGeotherm({
					...m,
					basalHeatFlowMWm2: undefined,
					surfaceHeatFlowMWm2: fromBase.surfaceHeatFlowMWm2
				});
				expectClose(
					fromTop.basalHeatFlowMWm2,
					m.basalHeatFlowMWm2,
					{ abs: 1e-9, rel: 1e-10 },
					'qb'
				);
				fromTop.temperatureC.forEach((t, i) =>
					expectClose(t, fromBase.temperatureC[i], { abs: 1e-9, rel: 1e-10 }, `T[${i}]`)
				);
			}),
			{ numRuns: 100 }
		);
	});
});
