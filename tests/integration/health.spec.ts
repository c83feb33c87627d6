import { describe, expect, it } from 'vitest';
import { testEnv } from './env';
import { DEMO_PASSWORD, signIn } from './http';

describe('/api/health', () => {
	it('tells anyone which services are up, without versions or internal details', async () => {
		const res = await fetch(`${testEnv.appUrl()}/api/health`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.status).toBe('ok');
		expect(body.services.database).toMatchObject({ status: 'up' });
		expect(body.services.objectStore).toMatchObject({ status: 'up' });
		expect(body.services.mail).toMatchObject({ status: 'up' });
		const text = JSON.stringify(body);
		expect(text).not.toMatch(/PostgreSQL|PostGIS|bucket/i);
		for (const s of Object.values(body.services)) expect(s).not.toHaveProperty('detail');
	});

	it('reports PostgreSQL and PostGIS versions to a platform administrator', async () => {
		const admin = await signIn('admin@thermalith.example', DEMO_PASSWORD);
		const body = await (await admin.get('/api/health')).json();
		expect(body.services.database.detail).toMatch(/PostGIS 3\.\d+/);
	});
});
