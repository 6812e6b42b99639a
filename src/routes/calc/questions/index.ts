import { balanceQuestion } from './balance';
import { bounceQuestion } from './bounce';
import { gelQuestion, shiftQuestion } from './colour';
import { flashQuestion } from './flash';
import { opticsQuestion } from './optics';
import { stackQuestion } from './stack';
import type { Question } from './types';

export type { Answer, Question } from './types';

/** The calculator's questions, in the order the page shows them. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const QUESTIONS: Question<any, any>[] = [flashQuestion, bounceQuestion, opticsQuestion, stackQuestion, balanceQuestion, shiftQuestion, gelQuestion];

export function questionById(id: string) {
	return QUESTIONS.find((q) => q.id === id);
}
