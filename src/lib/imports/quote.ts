/** Longest piece of a user's file repeated in an error message. */
export const QUOTE_MAX = 80;

/**
 * A token from an uploaded file, quoted for an error message and cut to QUOTE_MAX characters:
 * a message names the line and shows enough to find the problem, never megabytes of the input.
 */
export function quoteToken(value: string, max = QUOTE_MAX): string {
	const chars = Array.from(value);
	if (chars.length <= max) return JSON.stringify(value);
	return `${JSON.stringify(chars.slice(0, max).join(''))}… (${chars.length.toLocaleString('en')} characters)`;
}

/** The same cut without quotes, for names shown in a list (curve mnemonics, column headers). */
export function clipToken(value: string, max = QUOTE_MAX): string {
	const chars = Array.from(value);
	return chars.length <= max ? value : `${chars.slice(0, max).join('')}…`;
}
