// Telling "the database is away" apart from every other failure, so an outage is answered with 503
// and never taken for a bug (500) or a signed-out caller (401).

/** Thrown where an unreachable database was noticed but its error was swallowed (by Auth.js). */
export class DatabaseUnreachable extends Error {
	constructor() {
		super('The database is unreachable.');
		this.name = 'DatabaseUnreachable';
	}
}

/** postgres.js's own connection errors. */
const DRIVER_CODES = new Set(['CONNECT_TIMEOUT', 'CONNECTION_CLOSED', 'CONNECTION_ENDED', 'CONNECTION_DESTROYED']);

/** Node's socket errors; they count only on the database's port (the mail server's are not an outage). */
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE']);

/**
 * PostgreSQL's SQLSTATEs for a server that is shutting down, starting up or refusing connections
 * (PostgreSQL documentation, Appendix A "PostgreSQL Error Codes": class 08, 57P01–57P03, 53300).
 */
function isUnavailableState(code: string): boolean {
	return code.startsWith('08') || ['57P01', '57P02', '57P03', '53300'].includes(code);
}

/**
 * Whether `error`, or what it wraps (Drizzle puts the driver's error in `cause`, Auth.js in
 * `cause.err`, Node a failed connection's attempts in `errors`), says the database at `databasePort` could not be reached.
 */
export function isDatabaseUnreachable(error: unknown, databasePort: number | null, depth = 0): boolean {
	if (depth > 5 || typeof error !== 'object' || error === null) return false;
	if (error instanceof DatabaseUnreachable) return true;
	const { code, port, severity, cause, errors, err } = error as Record<string, unknown>;
	if (typeof code === 'string') {
		if (DRIVER_CODES.has(code)) return true;
		// Only PostgreSQL's own errors carry a severity next to their SQLSTATE.
		if (typeof severity === 'string' && isUnavailableState(code)) return true;
		if (SOCKET_CODES.has(code) && port === databasePort) return true;
	}
	if (Array.isArray(errors) && errors.some((e) => isDatabaseUnreachable(e, databasePort, depth + 1))) return true;
	// Auth.js wraps an adapter's error as `cause: { err }`.
	return isDatabaseUnreachable(cause, databasePort, depth + 1) || isDatabaseUnreachable(err, databasePort, depth + 1);
}
