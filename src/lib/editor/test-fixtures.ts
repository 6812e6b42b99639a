/** Small setups for the editor's tests (the quartz cluster of the Fernhill Geology Circle's catalogue). */
import type { ExposureScene } from '$lib/light/schema';
import { addElement, ok, type AddOptions, type Command } from './commands';
import { setElementProperties } from './commands-properties';
import { Editor } from './editor.svelte';
import { History } from './history';
import { applyDiff, squashDiffs } from './model/diff';
import { openDocument } from './model/document';
import { modelFromScene } from './model/layout';
import type { ElementKind } from './model/schema';
import type { EditorModel } from './model/types';

/**
 * A quartz cluster at the origin, 3 cm up, the face the tests read turned to the key (its normal), so
 * the laid-out camera in front does not make the key a grazing light; one flash 50 cm to its left at
 * subject height; f/16 at 1:2.
 */
export function quartzScene(): ExposureScene {
	return {
		camera: { iso: 100, aperture: 16, shutter: 1 / 160, magnification: 0.5 },
		subject: { position: [0, 0, 0.03], normal: [-1, 0, 0] },
		lights: [{ id: 'key', kind: 'flash', position: [-0.5, 0, 0.03], guideNumber: 40, power: 1 / 8 }]
	};
}

export function quartzModel(): EditorModel {
	return modelFromScene(quartzScene()).model;
}

/** An editor on the quartz setup at 1000 px/m, the plan's origin (the subject) at the stage's centre. */
export function quartzEditor(): Editor {
	const e = new Editor({ document: openDocument({ scene: quartzScene(), plan: {} }) });
	e.setStageSize(800, 600);
	e.setViewport({ zoom: 1000, panX: 400, panY: 300 });
	return e;
}

/** Places an element and sets some of its properties (checked), as one command: a placement and the fields typed after it. */
export function addWith(kind: ElementKind, at: AddOptions, props: Record<string, unknown>): Command {
	return (model) => {
		const added = addElement(kind, at)(model);
		if (!added.ok) return added;
		const set = setElementProperties(added.createdIds[0], props)(applyDiff(model, added.diff));
		return set.ok ? ok(squashDiffs([added.diff, set.diff]), added.createdIds) : set;
	};
}

/** Runs commands each as an undo step, as the editor does (a model and a history, no browser). */
export function commandSession(model = quartzModel()) {
	const history = new History();
	return {
		get model() {
			return model;
		},
		run(command: Command) {
			const r = command(model);
			if (r.ok) {
				history.mark();
				history.record(r.diff);
				model = applyDiff(model, r.diff);
			}
			return r;
		},
		undo() {
			const d = history.undo();
			if (d) model = applyDiff(model, d);
		},
		redo() {
			const d = history.redo();
			if (d) model = applyDiff(model, d);
		}
	};
}
