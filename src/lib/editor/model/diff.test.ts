import { describe, expect, it } from 'vitest';
import { defaultElement } from './defaults';
import { applyDiff, emptyDiff, isEmptyDiff, reverseDiff, squashDiffs } from './diff';
import { quartzModel } from '../test-fixtures';

describe('model diffs', () => {
	const model = quartzModel();
	const card = defaultElement('reflector', { id: 'card', label: 'Card', xM: 0.3, yM: 0, zIndex: 5 });

	it('apply then apply the reverse gives back the same model', () => {
		const d = emptyDiff();
		d.added.card = card;
		d.updated.key = [model.elements.key, { ...model.elements.key, label: 'Main' }];
		d.camera = [model.camera, { ...model.camera, aperture: 22 }];
		const after = applyDiff(model, d);
		expect(after.elements.card).toBe(card);
		expect(after.elements.key.label).toBe('Main');
		expect(after.camera.aperture).toBe(22);
		const back = applyDiff(after, reverseDiff(d));
		expect(back).toEqual(model);
		expect(model.camera.aperture).toBe(16); // the original is never mutated
	});

	it('squashes an update chain into first-before and last-after', () => {
		const k0 = model.elements.key;
		const k1 = { ...k0, xM: -0.6 };
		const k2 = { ...k1, xM: -0.7 };
		const a = emptyDiff();
		a.updated.key = [k0, k1];
		const b = emptyDiff();
		b.updated.key = [k1, k2];
		expect(squashDiffs([a, b]).updated.key).toEqual([k0, k2]);
	});

	it('a removal followed by adding the same id is an update', () => {
		const r = emptyDiff();
		r.removed.key = model.elements.key;
		const a = emptyDiff();
		const back = { ...model.elements.key, label: 'Key again' };
		a.added.key = back;
		const s = squashDiffs([r, a]);
		expect(s.updated.key).toEqual([model.elements.key, back]);
		expect(Object.keys(s.removed)).toEqual([]);
	});

	it('a change that returns to where it started is empty', () => {
		const a = emptyDiff();
		a.camera = [model.camera, { ...model.camera, iso: 200 }];
		const b = emptyDiff();
		b.camera = [a.camera[1], model.camera];
		expect(isEmptyDiff(squashDiffs([a, b]))).toBe(true);
	});
});
