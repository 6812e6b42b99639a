/**
 * The present view's state: every step of the lesson loaded once, the step shown, the blank screen,
 * and one editor holding the shown step's plan. A step change is local: the editor loads the step's
 * prepared document (its visible elements only) and the plan and numbers follow, with no request.
 * What the instructor drags or changes is a what-if in that editor: never saved, forgotten on the next
 * step, unless kept on purpose as a new revision (`keptDocument`).
 */
import { Editor } from '$lib/editor/editor.svelte';
import { openDocument, type SetupDocument } from '$lib/editor/model/document';
import type { UnitSystem } from '$lib/light/format';
import { isStepAction, stepIndexAfter } from './navigation';
import type { PresentAction } from './keys';
import { keptDocument, visibleDocument, type StepDocument } from './step-view';

/** A step as the present view and the presenter window get it from the server. */
export interface PresentStep {
	id: string;
	caption: string;
	setupId: string;
	setupTitle: string;
	revisionNumber: number;
	/** The pinned revision's document. */
	document: StepDocument;
	/** The elements the step shows (null: all of them). */
	visibleIds: string[] | null;
}

/** A step as the presenter window shows it. */
export interface PresenterStep {
	id: string;
	caption: string;
	setupTitle: string;
	revisionNumber: number;
	/** Names of the elements the step shows. */
	shows: string[];
}

export interface PresentationOptions {
	startIndex?: number;
	unitSystem?: UnitSystem;
	/** Called after every change of step (not on the first load). */
	onstep?: (index: number, step: PresentStep) => void;
}

export class Presentation {
	readonly steps: readonly PresentStep[];
	readonly editor: Editor;
	index = $state(0);
	blank = $state(false);
	/** When presenting began (ms since 1970), for the presenter window's elapsed time. */
	readonly startedAt = Date.now();
	readonly #documents: SetupDocument[];
	readonly #onstep?: (index: number, step: PresentStep) => void;

	constructor(steps: readonly PresentStep[], options: PresentationOptions = {}) {
		this.steps = steps;
		this.#documents = steps.map((s) => visibleDocument(s.document, s.visibleIds));
		this.#onstep = options.onstep;
		const start = Math.min(Math.max(options.startIndex ?? 0, 0), Math.max(steps.length - 1, 0));
		this.index = start;
		this.editor = new Editor({ document: openDocument(this.#documents[start]), unitSystem: options.unitSystem });
	}

	get step(): PresentStep | undefined {
		return this.steps[this.index];
	}
	get nextStep(): PresentStep | undefined {
		return this.steps[this.index + 1];
	}

	/** A key's action: a step action moves, B blanks (F is the page's: full screen needs the DOM). Returns true when it did something. */
	act(action: PresentAction): boolean {
		if (action === 'blank') {
			this.blank = !this.blank;
			return true;
		}
		if (!isStepAction(action)) return false;
		return this.goTo(stepIndexAfter(action, this.index, this.steps.length));
	}

	/** Shows step `index` (its pinned plan, any what-if forgotten). Returns false when already there. */
	goTo(index: number): boolean {
		if (index === this.index || index < 0 || index >= this.steps.length) return false;
		this.index = index;
		this.editor.loadDocument(openDocument(this.#documents[index]));
		this.#onstep?.(index, this.steps[index]);
		return true;
	}

	/** Something was moved or changed on this step since it was shown. */
	get whatIfChanged(): boolean {
		return this.editor.dirty;
	}

	/** Back to the step as it was pinned. */
	resetWhatIf() {
		this.editor.loadDocument(openDocument(this.#documents[this.index]));
	}

	/** The document to keep as a new revision of the step's setup: the pinned revision with the what-if applied. */
	keptDocument(): SetupDocument | null {
		const step = this.step;
		return step ? keptDocument(step.document, step.visibleIds, this.editor.model) : null;
	}

	destroy() {
		this.editor.destroy();
	}
}
