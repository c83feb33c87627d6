/**
 * Only for regenerating the auth tables' Drizzle schema with better-auth's CLI:
 *   npx -y @better-auth/cli@1.4.22 generate --config scripts/auth-cli-config.ts --output /tmp/auth-schema.ts --yes
 * then compare with src/lib/server/db/schema/auth.ts. The app never imports this file.
 */
import { createAuth } from '../src/lib/server/auth/create-auth';
import { createDb } from '../src/lib/server/db/client';

export const auth = createAuth({
	db: createDb('postgres://localhost/unused').db,
	secret: 'x'.repeat(32),
	baseURL: 'http://127.0.0.1:3000',
	send: async () => {},
	production: false
});
