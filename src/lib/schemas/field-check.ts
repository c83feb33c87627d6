import type { z } from 'zod';

/**
 * A field's live check from its zod schema (the same one the server parses with), so a message
 * shown while typing is the message the server would give.
 */
export function fieldCheck(schema: z.ZodType) {
	return (value: string): string | undefined => {
		const parsed = schema.safeParse(value);
		return parsed.success ? undefined : parsed.error.issues[0]?.message;
	};
}
