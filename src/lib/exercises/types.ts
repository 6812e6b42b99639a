// What the pages get of an exercise: shared by the server, which makes it, and the components.
import type { Target } from '$lib/light/targets';
import type { HandInState } from './states';

export interface ExerciseSummary {
	id: string;
	workshopId: string;
	lessonId: string;
	lessonTitle: string;
	title: string;
	brief: string;
	briefHtml: string;
	dueAt: string;
	/** The due date has passed: a hand-in now is marked late. */
	pastDue: boolean;
	setupId: string;
	revisionNumber: number;
	targets: Target[];
	/** Each target in words ("Lighting ratio: 2.5:1 to 4:1"). */
	targetWords: string[];
	/** For a student: their copy (null until started) and their latest hand-in. */
	mine: { setupId: string | null; latest: { id: string; version: number; state: HandInState; late: boolean } | null } | null;
}

/** One student's row of an exercise's table: their latest hand-in, or none. */
export interface HandInRow {
	userId: string;
	name: string | null;
	email: string;
	/** Null: not handed in yet. */
	handInId: string | null;
	version: number | null;
	handedInAt: string | null;
	late: boolean;
	targetsMet: number | null;
	targetsTotal: number | null;
	state: HandInState | null;
}
