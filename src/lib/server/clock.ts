/**
 * The product's one source of "now" and "today". The visibility rule (access/visibility.ts), grant
 * expiry and the embargo release job all read the date through `utcDay`, so they agree on what
 * "today" is (UTC, whatever the server's or the database session's time zone). Code that decides
 * by date takes an `at` argument defaulting to `new Date()`, so tests pass another day.
 */
export function utcDay(at: Date): string {
	return at.toISOString().slice(0, 10);
}
