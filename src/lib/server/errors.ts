/**
 * A request that breaks a rule of the product (the last owner leaving, an expired invitation).
 * Pages turn it into `fail(400)`, API routes into the API's 400 body; it never becomes a 500.
 */
export class RuleViolation extends Error {
	/** The fields at fault, as the API's error body lists them: by default the one `field`, or none. */
	readonly issues: { path: string[]; message: string }[];

	constructor(
		message: string,
		readonly field: string | null = null,
		readonly status: 400 | 409 | 410 | 429 | 503 = 400,
		issues?: { path: string[]; message: string }[]
	) {
		super(message);
		this.name = 'RuleViolation';
		this.issues = issues ?? (field ? [{ path: [field], message }] : []);
	}
}
