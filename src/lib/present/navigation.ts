/** Moving between the steps of a lesson: the index a step action leads to (held at both ends). */
import type { PresentAction } from './keys';

export type StepAction = Extract<PresentAction, 'next' | 'previous' | 'first' | 'last'>;

export function isStepAction(action: PresentAction): action is StepAction {
	return action === 'next' || action === 'previous' || action === 'first' || action === 'last';
}

/** The index after `action` from `index` among `count` steps (no wrapping: the last step stays the last). */
export function stepIndexAfter(action: StepAction, index: number, count: number): number {
	if (count <= 0) return 0;
	const last = count - 1;
	const from = Math.min(Math.max(index, 0), last);
	switch (action) {
		case 'next':
			return Math.min(from + 1, last);
		case 'previous':
			return Math.max(from - 1, 0);
		case 'first':
			return 0;
		case 'last':
			return last;
	}
}

/** "Step 2 of 3". */
export function stepCounter(index: number, count: number): string {
	return count ? `Step ${index + 1} of ${count}` : 'No steps';
}
