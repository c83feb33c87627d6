import { describe, expect, it } from 'vitest';
import { nulRefusal } from './nul-guard';

describe('nulRefusal', () => {
	it.each(['/organisations/%00', '/datasets/x?q=%00', '/datasets/x?q=a%00b'])('refuses %s', (p) => {
		expect(nulRefusal(new URL(p, 'http://app.example'))?.status).toBe(400);
	});

	it.each(['/datasets/x?q=a%2500b', '/map?method=bullard', '/'])('lets %s through', (p) => {
		expect(nulRefusal(new URL(p, 'http://app.example'))).toBeNull();
	});
});
