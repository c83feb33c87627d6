import { describe, expect, it } from 'vitest';
import { testEnv } from './env';

describe('/api/health', () => {
	it('reports PostgreSQL with PostGIS, the object store and the mail server up', async () => {
		const res = await fetch(`${testEnv.appUrl()}/api/health`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.status).toBe('ok');
		expect(body.services.database).toMatchObject({ status: 'up' });
		expect(body.services.database.detail).toMatch(/PostGIS 3\.\d+/);
		expect(body.services.objectStore).toMatchObject({ status: 'up' });
		expect(body.services.mail).toMatchObject({ status: 'up' });
	});
});
