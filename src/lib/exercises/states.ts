/** A hand-in's review states, shared by the database schema, the inputs and the pages. */
export const HAND_IN_STATES = ['handed-in', 'accepted', 'another-try'] as const;
export type HandInState = (typeof HAND_IN_STATES)[number];

/** The states an instructor sets in a review. */
export const REVIEW_STATES = ['accepted', 'another-try'] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];

export const STATE_WORDS: Record<HandInState, string> = {
	'handed-in': 'Waiting for review',
	accepted: 'Accepted',
	'another-try': 'Another try'
};
