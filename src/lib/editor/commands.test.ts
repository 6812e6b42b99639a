import { describe, expect, it } from 'vitest';
import {
	addElement,
	aimAtSubject,
	bringToFront,
	duplicateElements,
	moveElementsBy,
	removeElements,
	rotateElementsAbout,
	setLocked
} from './commands';
import { insertElement, setAmbient, setCameraSettings, setElementProperties } from './commands-properties';
import { direction3 } from './model/geometry';
import type { EditorModel } from './model/types';
import { commandSession as session } from './test-fixtures';

const only = (m: EditorModel, kind: string) => Object.values(m.elements).filter((e) => e.kind === kind);

describe('commands', () => {
	it('add, then undo and redo', () => {
		const s = session();
		const r = s.run(addElement('flash', { xM: 0.3, yM: -0.2 }));
		expect(r.ok && r.createdIds).toEqual(['flash-1']);
		expect(s.model.elements['flash-1']).toMatchObject({ kind: 'flash', xM: 0.3, yM: -0.2, label: 'Flash' });
		s.undo();
		expect(s.model.elements['flash-1']).toBeUndefined();
		s.redo();
		expect(s.model.elements['flash-1'].xM).toBe(0.3);
	});

	it('a new light is aimed at the subject; a new card bounces the nearest light onto it', () => {
		const s = session();
		s.run(addElement('flash', { xM: 0, yM: -0.4 }));
		expect(s.model.elements['flash-1'].rotationDeg).toBeCloseTo(90);
		s.run(addElement('reflector', { xM: 0.4, yM: 0 }));
		const card = s.model.elements['reflector-1'];
		expect(card.kind === 'reflector' && card.source).toBe('flash-1');
		// Facing half-way between the light (up-left) and the subject (left): the mirror law's normal.
		const n = direction3(card.rotationDeg, card.kind === 'reflector' ? card.tiltDeg : 0);
		const unit = (v: number[]) => v.map((c) => c / Math.hypot(...v));
		const light = s.model.elements['flash-1'];
		const subject = only(s.model, 'subject')[0];
		const toSubject = unit([subject.xM - card.xM, subject.yM - card.yM, subject.heightM - card.heightM]);
		const toLight = unit([light.xM - card.xM, light.yM - card.yM, light.heightM - card.heightM]);
		const cosSubject = n[0] * toSubject[0] + n[1] * toSubject[1] + n[2] * toSubject[2];
		const cosLight = n[0] * toLight[0] + n[1] * toLight[1] + n[2] * toLight[2];
		expect(cosSubject).toBeCloseTo(cosLight, 9);
		expect(cosSubject).toBeGreaterThan(0.5);
	});

	it('refuses a second subject and a second camera', () => {
		const s = session();
		const r = s.run(addElement('subject', { xM: 0, yM: 0 }));
		expect(r.ok).toBe(false);
		expect(!r.ok && r.error.message).toMatch(/already has a subject/);
		// The laid-out plan has its camera already.
		expect(only(s.model, 'camera')).toHaveLength(1);
		expect(s.run(addElement('camera', { xM: 0, yM: 0.4 })).ok).toBe(false);
		s.run(removeElements([only(s.model, 'camera')[0].id]));
		expect(s.run(addElement('camera', { xM: 0, yM: 0.4 })).ok).toBe(true);
	});

	it('delete is undone with the element exactly as it was', () => {
		const s = session();
		const before = s.model.elements.key;
		s.run(removeElements(['key']));
		expect(s.model.elements.key).toBeUndefined();
		s.undo();
		expect(s.model.elements.key).toBe(before);
	});

	it('the subject cannot be deleted; locked elements are neither moved nor deleted', () => {
		const s = session();
		const subjectId = only(s.model, 'subject')[0].id;
		expect(s.run(removeElements([subjectId])).ok).toBe(false);
		s.run(setLocked(['key'], true));
		const move = s.run(moveElementsBy(['key'], 0.1, 0));
		expect(!move.ok && move.error.message).toMatch(/locked/);
		expect(s.run(removeElements(['key'])).ok).toBe(false);
		const prop = s.run(setElementProperties('key', { xM: 1 }));
		expect(!prop.ok && prop.error.path).toEqual(['xM']);
		// Other properties can still be set.
		expect(s.run(setElementProperties('key', { power: 0.5 })).ok).toBe(true);
	});

	it('duplicate makes unlocked copies with new ids, one undo step removes them all', () => {
		const s = session();
		s.run(addElement('reflector', { xM: 0.3, yM: 0 }));
		s.run(setLocked(['key'], true));
		const r = s.run(duplicateElements(['key', 'reflector-1'], [0.05, 0.05]));
		expect(r.ok && r.createdIds).toEqual(['flash-1', 'reflector-2']);
		const copy = s.model.elements['flash-1'];
		expect(copy).toMatchObject({ kind: 'flash', xM: -0.45, yM: 0.05, locked: false, label: 'key copy' });
		// The card's copy bounces the light's copy.
		const cardCopy = s.model.elements['reflector-2'];
		expect(cardCopy.kind === 'reflector' && cardCopy.source).toBe('flash-1');
		s.undo();
		expect(s.model.elements['flash-1']).toBeUndefined();
		expect(s.model.elements['reflector-2']).toBeUndefined();
	});

	it('aims a light turned away back at the subject, in plan and in height', () => {
		const s = session();
		s.run(setElementProperties('key', { rotationDeg: 120, tiltDeg: 30, heightM: 0.53 }));
		s.run(aimAtSubject(['key']));
		const key = s.model.elements.key;
		expect(key.rotationDeg).toBeCloseTo(0);
		// 0.5 m up over 0.5 m across: 45° down.
		expect(key.kind === 'flash' && key.tiltDeg).toBeCloseTo(-45);
	});

	it('rotates a selection about a centre', () => {
		const s = session();
		const start = { key: { xM: -0.5, yM: 0, rotationDeg: 0 } };
		s.run(rotateElementsAbout(start, [0, 0], 90));
		expect(s.model.elements.key.xM).toBeCloseTo(0);
		expect(s.model.elements.key.yM).toBeCloseTo(-0.5);
		expect(s.model.elements.key.rotationDeg).toBeCloseTo(90);
	});

	it('refuses bad property values and names the field', () => {
		const s = session();
		const power = s.run(setElementProperties('key', { power: 2 }));
		expect(!power.ok && power.error).toEqual({ message: 'power must be at most 1 (full power)', path: ['power'] });
		const gn = s.run(setElementProperties('key', { guideNumber: Number.NaN }));
		expect(!gn.ok && gn.error.path).toEqual(['guideNumber']);
		const unknown = s.run(setElementProperties('key', { luxAt1m: 100 }));
		expect(!unknown.ok && unknown.error.path).toEqual(['luxAt1m']);
		const kind = s.run(setElementProperties('key', { kind: 'continuous' }));
		expect(!kind.ok && kind.error.path).toEqual(['kind']);
		s.run(addElement('reflector', { xM: 0.3, yM: 0 }));
		const source = s.run(setElementProperties('reflector-1', { source: 'nothing-here' }));
		expect(!source.ok && source.error.path).toEqual(['source']);
	});

	it('sets camera settings and the ambient, checked, each undoable', () => {
		const s = session();
		expect(s.run(setCameraSettings({ aperture: 22, magnification: 1 })).ok).toBe(true);
		expect(s.model.camera).toMatchObject({ aperture: 22, magnification: 1, iso: 100 });
		const bad = s.run(setCameraSettings({ iso: -5 }));
		expect(!bad.ok && bad.error.path).toEqual(['camera', 'iso']);
		s.run(setAmbient({ ev100: 9 }));
		expect(only(s.model, 'ambient')).toMatchObject([{ ev100: 9, kelvin: null, source: 'sky' }]);
		s.undo();
		expect(only(s.model, 'ambient')).toEqual([]);
		s.undo();
		expect(s.model.camera.aperture).toBe(16);
	});

	it('inserts a whole element, renaming a taken id', () => {
		const s = session();
		const r = s.run(insertElement({ ...s.model.elements.key, label: 'Pasted' }));
		expect(r.ok && r.createdIds).toEqual(['flash-1']);
	});

	it('brings to front above everything', () => {
		const s = session();
		s.run(addElement('flag', { xM: 0.1, yM: 0.1 }));
		s.run(bringToFront(['key']));
		const top = Math.max(...Object.values(s.model.elements).map((e) => e.zIndex));
		expect(s.model.elements.key.zIndex).toBe(top);
	});
});
