// The live session's current position: which lesson and step the instructor shows now. Kept on the
// workshop row, so every app server reads the same; followers are told of a change elsewhere.
import { error } from '@sveltejs/kit';
import { authorizeWorkshop } from '$lib/server/authz';
import type { SessionUser } from '$lib/server/session';
import { findStepPlace, setLivePosition } from '$lib/server/db/queries/workshops';
import { isUuid } from '$lib/uuid';
import { RuleViolation } from '$lib/server/errors';
import type { LivePosition } from './workshops';

export type { LivePosition };

/** Where the live session stands, for anyone who may follow the workshop; null when it is not live. */
export async function getLiveStep(user: SessionUser | null, workshopId: string): Promise<LivePosition | null> {
	const { workshop } = await authorizeWorkshop(user, workshopId, 'workshop.follow');
	if (!workshop.liveUpdatedAt || !workshop.liveStepId) return null;
	return { lessonId: workshop.liveLessonId, stepId: workshop.liveStepId, updatedAt: workshop.liveUpdatedAt.toISOString() };
}

/**
 * Moves the live session to a step of this workshop (instructors, studio owners and editors), or ends
 * it with `stepId` null. A step of another workshop is refused, naming the field.
 */
export async function setLiveStep(user: SessionUser | null, workshopId: string, stepId: string | null): Promise<LivePosition | null> {
	const access = await authorizeWorkshop(user, workshopId, 'workshop.run');
	if (stepId === null) {
		await setLivePosition(access.workshop.id, null, null);
		return null;
	}
	const place = isUuid(stepId) ? await findStepPlace(stepId) : null;
	if (!place || place.workshopId !== access.workshop.id) throw new RuleViolation('That step is not part of this workshop.', 'stepId');
	const row = await setLivePosition(access.workshop.id, place.lessonId, place.stepId);
	if (!row?.liveUpdatedAt) error(404, 'No such workshop.');
	return { lessonId: row.liveLessonId, stepId: row.liveStepId, updatedAt: row.liveUpdatedAt.toISOString() };
}
