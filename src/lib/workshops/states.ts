/** A workshop's states, shared by the database schema, the inputs and the pages. */
export const WORKSHOP_STATES = ['draft', 'published', 'archived'] as const;
export type WorkshopState = (typeof WORKSHOP_STATES)[number];

export const STATE_WORDS: Record<WorkshopState, string> = {
	draft: 'Draft (only those who run it and its students see it)',
	published: 'Published (a public page anyone can read)',
	archived: 'Archived (no public page; students keep reading it)'
};
