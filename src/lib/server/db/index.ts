import { config } from '../config';
import { createDb, type Db } from './client';

let instance: ReturnType<typeof createDb> | undefined;

/** The app's shared database client (created on first use from DATABASE_URL). */
export function getDb(): Db {
	instance ??= createDb(config().DATABASE_URL);
	return instance.db;
}

/** The underlying postgres.js client, for health checks and COPY. */
export function getSql() {
	getDb();
	return instance!.client;
}

/** Close the pool so the process can exit when adapter-node shuts down. */
export async function closeDb(): Promise<void> {
	await instance?.client.end({ timeout: 5 });
	instance = undefined;
}
