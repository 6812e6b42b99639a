export type UnitSystem = 'metric' | 'imperial';

/** What every load, action and API route knows about the caller. */
export interface SessionUser {
	id: string;
	name: string | null;
	email: string;
	isAdmin: boolean;
	unitSystem: UnitSystem;
}
