import { describe, expect, it } from 'vitest';
import { parseConductivitySamples } from './conductivity-samples';

describe('parseConductivitySamples', () => {
	it('finds columns by header, converts units (1 mcal/cm/s/K = 0.4184 W/m/K; 1 ft = 0.3048 m, NIST SP 811)', () => {
		const r = parseConductivitySamples(
			'bottom (ft);top (ft);k (mcal/cm/s/°C);k sigma\n200;100;6,0;0,5\n100;0;7,0;\n'
		);
		expect(r.ok).toBe(true);
		expect(r.intervals).toEqual([
			{ topM: 0, bottomM: 30.48, conductivityWmK: expect.closeTo(2.9288, 12) },
			{
				topM: 30.48,
				bottomM: 60.96,
				conductivityWmK: expect.closeTo(2.5104, 12),
				sigmaWmK: expect.closeTo(0.2092, 12)
			}
		]);
	});
	it('falls back to column order and reports bad rows by number', () => {
		const r = parseConductivitySamples(
			'a,b,c,d\n0,10,2.5,0.1\n10,5,2.5,0.1\n20,30,-1,0.1\n30,40,x,0.1\n40,50,2.5,-0.2\n'
		);
		expect(r.intervals.length).toBe(1);
		expect(r.issues.map((i) => i.message)).toEqual([
			'Row 3, column "b": "5" is not below the top depth (10 m).',
			'Row 4, column "c": "-1" is ≤ 0; conductivity must be positive.',
			'Row 5, column "c": "x" is not a number.',
			'Row 6, column "d": "-0.2" is negative; a standard deviation must be ≥ 0.'
		]);
		expect(r.ok).toBe(false);
	});
});
