/**
 * A request that breaks a rule of the product (the last owner leaving, an expired invitation).
 * Pages turn it into `fail(400)`, API routes into the API's 400 body; it never becomes a 500.
 */
export class RuleViolation extends Error {
	constructor(
		message: string,
		readonly field: string | null = null,
		readonly status: 400 | 409 | 410 | 429 = 400
	) {
		super(message);
		this.name = 'RuleViolation';
	}
}
