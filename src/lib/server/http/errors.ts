/** An expected failure a route turns into a 4xx: which field (when one), and a message for people. */
export class DomainError extends Error {
	constructor(
		readonly status: 400 | 403 | 404 | 409 | 413 | 415 | 422 | 429 | 503,
		message: string,
		readonly field?: string
	) {
		super(message);
	}

	/** What an API error body and an action failure say: `{ message, field? }`, and more in subclasses. */
	toJSON(): Record<string, unknown> {
		return this.field ? { message: this.message, field: this.field } : { message: this.message };
	}
}
