/**
 * A short name for addresses suggested from an organisation's name: lower case, accents dropped,
 * anything else between words made a single hyphen, at most 48 characters (the slug rule in
 * organisation.ts). The user may still type their own.
 */
// Letters that Unicode decomposition leaves alone but readers spell with Latin letters.
const SPELLED: Record<string, string> = {
	ø: 'o',
	æ: 'ae',
	œ: 'oe',
	ß: 'ss',
	đ: 'd',
	ł: 'l',
	þ: 'th'
};

export function suggestSlug(name: string): string {
	return name
		.toLowerCase()
		.replace(/[øæœßđłþ]/g, (c) => SPELLED[c])
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 48)
		.replace(/-+$/, '');
}
