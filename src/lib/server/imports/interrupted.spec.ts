import { describe, expect, it } from 'vitest';
import { IMPORT_MAX_ATTEMPTS, interruptedImportAction } from './interrupted';

describe('interruptedImportAction', () => {
	it('waits while the heartbeat is fresh, whatever the tries', () => {
		expect(interruptedImportAction({ attempts: 1, staleInS: 12.5 })).toEqual({
			kind: 'wait',
			afterS: 12.5
		});
		expect(interruptedImportAction({ attempts: IMPORT_MAX_ATTEMPTS, staleInS: 1 }).kind).toBe(
			'wait'
		);
	});

	it('resumes a stale batch while tries remain, then fails it with a message', () => {
		for (let attempts = 0; attempts < IMPORT_MAX_ATTEMPTS; attempts++)
			expect(interruptedImportAction({ attempts, staleInS: 0 })).toEqual({ kind: 'resume' });
		const last = interruptedImportAction({ attempts: IMPORT_MAX_ATTEMPTS, staleInS: 0 });
		expect(last.kind).toBe('fail');
		expect(last.kind === 'fail' && last.message).toMatch(
			/interrupted 3 times.*nothing was written/
		);
	});
});
