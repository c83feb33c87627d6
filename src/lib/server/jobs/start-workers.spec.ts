import { describe, expect, it } from 'vitest';
import { startWorkers } from './start-workers';

describe('startWorkers', () => {
	it('starts every worker even when an earlier one fails, and names the one that failed', async () => {
		const started: string[] = [];
		const warnings: string[] = [];
		const ok = (name: string) => async () => {
			started.push(name);
		};
		const failed = await startWorkers(
			{
				mail: ok('mail'),
				housekeeping: async () => {
					throw new Error('queue unreachable');
				},
				grids: ok('grids'),
				imports: () => Promise.reject(new Error('no schedule')),
				embargo: ok('embargo')
			},
			(message) => warnings.push(message)
		);
		expect(started.sort()).toEqual(['embargo', 'grids', 'mail']);
		expect(failed).toEqual(['housekeeping', 'imports']);
		expect(warnings).toEqual([
			'job worker "housekeeping" not started: queue unreachable',
			'job worker "imports" not started: no schedule'
		]);
	});

	it('does not wait for one start before beginning the next', async () => {
		const begun: string[] = [];
		let release = () => {};
		const slow = new Promise<void>((resolve) => (release = resolve));
		const all = startWorkers({
			first: async () => {
				begun.push('first');
				await slow;
			},
			second: async () => {
				begun.push('second');
			}
		});
		expect(begun).toEqual(['first', 'second']);
		release();
		expect(await all).toEqual([]);
	});
});
