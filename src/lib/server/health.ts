import { HeadBucketCommand } from '@aws-sdk/client-s3';
import { getSql } from './db';
import { mailer } from './mail';
import { bucket, s3 } from './storage';

export interface ServiceStatus {
	status: 'up' | 'down';
	latencyMs: number;
	detail?: string;
	error?: string;
}

export interface HealthReport {
	status: 'ok' | 'degraded';
	version: string;
	checkedAt: string;
	services: { database: ServiceStatus; objectStore: ServiceStatus; mail: ServiceStatus };
}

const TIMEOUT_MS = 3000;

async function probe(fn: () => Promise<string | undefined>): Promise<ServiceStatus> {
	const started = performance.now();
	try {
		const detail = await Promise.race([
			fn(),
			new Promise<never>((_, reject) =>
				setTimeout(() => reject(new Error(`no answer within ${TIMEOUT_MS} ms`)), TIMEOUT_MS)
			)
		]);
		return { status: 'up', latencyMs: Math.round(performance.now() - started), detail };
	} catch (err) {
		return {
			status: 'down',
			latencyMs: Math.round(performance.now() - started),
			error: err instanceof Error ? err.message : String(err)
		};
	}
}

/** Check PostgreSQL (and PostGIS), the object store's bucket and the SMTP server, in parallel. */
export async function checkHealth(version: string): Promise<HealthReport> {
	const [database, objectStore, mail] = await Promise.all([
		probe(async () => {
			const [row] =
				await getSql()`SELECT current_setting('server_version') AS pg, postgis_lib_version() AS postgis`;
			return `PostgreSQL ${row.pg}, PostGIS ${row.postgis}`;
		}),
		probe(async () => {
			await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
			return `bucket ${bucket()}`;
		}),
		probe(async () => {
			await mailer().verify();
			return 'SMTP accepts connections';
		})
	]);
	const allUp = [database, objectStore, mail].every((s) => s.status === 'up');
	return {
		status: allUp ? 'ok' : 'degraded',
		version,
		checkedAt: new Date().toISOString(),
		services: { database, objectStore, mail }
	};
}

/**
 * What anyone may learn from /api/health: up or down and how fast, per service. Versions, bucket
 * names and error messages (hosts, ports) help an attacker pick exploits; only platform
 * administrators see them.
 */
export function publicHealth(report: HealthReport): HealthReport {
	const bare = ({ status, latencyMs }: ServiceStatus): ServiceStatus => ({ status, latencyMs });
	return {
		...report,
		services: {
			database: bare(report.services.database),
			objectStore: bare(report.services.objectStore),
			mail: bare(report.services.mail)
		}
	};
}
