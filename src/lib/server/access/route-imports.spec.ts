import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

/* The lint rule that keeps queries out of routes (eslint.config.js, src/routes/**). */
const eslint = new ESLint();
const rulesHit = async (code: string, filePath: string) =>
	(await eslint.lintText(code, { filePath }))[0].messages.map((m) => m.ruleId);

describe('routes may not query the database themselves', () => {
	// The first lint loads the whole configuration and its parsers and plugins: seconds on a busy
	// machine, so it happens once here with room to spare instead of inside a test's time limit.
	beforeAll(
		() => rulesHit('export const warm = 1;\n', 'src/routes/(app)/x/+page.server.ts'),
		120_000
	);

	it.each([
		"import { eq } from 'drizzle-orm';",
		"import { sql } from 'drizzle-orm/sql';",
		"import { dataset } from '$lib/server/db/schema';",
		"import { site } from '$lib/server/db/schema/sites';"
	])('refuses `%s` in a route', async (line) => {
		const code = `${line}\nexport const x = [${line.match(/\{ (\w+) \}/)![1]}];\n`;
		expect(await rulesHit(code, 'src/routes/(app)/x/+page.server.ts')).toContain(
			'no-restricted-imports'
		);
	});

	it('allows the same import in a repository', async () => {
		const code = "import { eq } from 'drizzle-orm';\nexport const x = [eq];\n";
		expect(await rulesHit(code, 'src/lib/server/repositories/x.ts')).not.toContain(
			'no-restricted-imports'
		);
	});
});
