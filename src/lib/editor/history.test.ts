import { describe, expect, it } from 'vitest';
import { History } from './history';
import { applyDiff, emptyDiff, type ModelDiff } from './model/diff';
import { defaultElement } from './model/defaults';
import type { EditorModel } from './model/types';
import { quartzModel } from './test-fixtures';

function moved(model: EditorModel, id: string, xM: number): ModelDiff {
	const d = emptyDiff();
	d.updated[id] = [model.elements[id], { ...model.elements[id], xM }];
	return d;
}

/** A tiny store: the model plus the history, as the editor uses them. */
function store() {
	let model = quartzModel();
	const history = new History();
	return {
		get model() {
			return model;
		},
		history,
		change(diff: ModelDiff) {
			history.record(diff);
			model = applyDiff(model, diff);
		},
		apply(diff: ModelDiff | null) {
			if (diff) model = applyDiff(model, diff);
		}
	};
}

describe('History', () => {
	it('undoes a whole gesture (many moves after one mark) in one step', () => {
		const s = store();
		const x0 = s.model.elements.key.xM;
		s.history.mark();
		for (let i = 1; i <= 30; i++) s.change(moved(s.model, 'key', x0 - i * 0.01));
		expect(s.model.elements.key.xM).toBeCloseTo(x0 - 0.3);
		expect(s.history.undoSteps).toBe(1);
		s.apply(s.history.undo());
		expect(s.model.elements.key.xM).toBe(x0);
		expect(s.history.canUndo).toBe(false);
		s.apply(s.history.redo());
		expect(s.model.elements.key.xM).toBeCloseTo(x0 - 0.3);
	});

	it('keeps steps apart by marks and undoes them in order', () => {
		const s = store();
		s.history.mark();
		s.change(moved(s.model, 'key', -0.6));
		s.history.mark();
		s.change(moved(s.model, 'key', -0.7));
		expect(s.history.undoSteps).toBe(2);
		s.apply(s.history.undo());
		expect(s.model.elements.key.xM).toBe(-0.6);
		s.apply(s.history.undo());
		expect(s.model.elements.key.xM).toBe(-0.5);
		s.apply(s.history.redo());
		expect(s.model.elements.key.xM).toBe(-0.6);
		s.apply(s.history.redo());
		expect(s.model.elements.key.xM).toBe(-0.7);
		expect(s.history.canRedo).toBe(false);
	});

	it('bails back to the mark and leaves nothing to redo', () => {
		const s = store();
		s.history.mark();
		s.change(moved(s.model, 'key', -0.6));
		const mark = s.history.mark();
		s.change(moved(s.model, 'key', -0.8));
		s.change(moved(s.model, 'key', -0.9));
		s.apply(s.history.bailToMark(mark));
		expect(s.model.elements.key.xM).toBe(-0.6);
		expect(s.history.canRedo).toBe(false);
		expect(s.history.hasMark(mark)).toBe(false);
		// The earlier step is still there to undo.
		s.apply(s.history.undo());
		expect(s.model.elements.key.xM).toBe(-0.5);
	});

	it('bail() goes back to the latest mark', () => {
		const s = store();
		s.history.mark();
		s.change(moved(s.model, 'key', -0.6));
		s.history.mark();
		s.change(moved(s.model, 'key', -1));
		s.apply(s.history.bail());
		expect(s.model.elements.key.xM).toBe(-0.6);
	});

	it('ignores marks with nothing after them (a click that did not drag)', () => {
		const s = store();
		s.history.mark();
		s.change(moved(s.model, 'key', -0.6));
		s.history.mark();
		s.history.mark();
		expect(s.history.undoSteps).toBe(1);
		s.apply(s.history.undo());
		expect(s.model.elements.key.xM).toBe(-0.5);
		expect(s.history.canUndo).toBe(false);
	});

	it('a new change after an undo clears the redo stack', () => {
		const s = store();
		s.history.mark();
		s.change(moved(s.model, 'key', -0.6));
		s.apply(s.history.undo());
		expect(s.history.canRedo).toBe(true);
		s.history.mark();
		s.change(moved(s.model, 'key', -0.4));
		expect(s.history.canRedo).toBe(false);
		expect(s.history.redo()).toBeNull();
	});

	it('an add then a remove inside one step squash to nothing', () => {
		const s = store();
		const card = defaultElement('reflector', { id: 'card', label: 'Card', xM: 0.2, yM: 0, zIndex: 9 });
		s.history.mark();
		const add = emptyDiff();
		add.added.card = card;
		s.change(add);
		const remove = emptyDiff();
		remove.removed.card = card;
		s.change(remove);
		expect(s.model.elements.card).toBeUndefined();
		expect(s.history.canUndo).toBe(false);
	});

	it('drops the oldest whole steps past its limit', () => {
		const h = new History(10);
		let model = quartzModel();
		for (let i = 0; i < 20; i++) {
			h.mark();
			const d = moved(model, 'key', i);
			h.record(d);
			model = applyDiff(model, d);
		}
		expect(h.undoSteps).toBeLessThanOrEqual(5);
		expect(h.undoSteps).toBeGreaterThan(0);
		const undo = h.undo()!;
		model = applyDiff(model, undo);
		expect(model.elements.key.xM).toBe(18);
	});
});
