import { describe, expect, it } from 'vitest';
import { Editor } from './editor.svelte';
import { openDocument } from './model/document';
import { SHORTCUTS } from './tools/shortcuts';
import { quartzEditor as editor } from './test-fixtures';

describe('Editor: keyboard', () => {
	it('Delete removes the selection and mod+Z brings it back', () => {
		const e = editor();
		e.select(['key']);
		expect(e.keyDown({ key: 'Delete' })).toBe(true);
		expect(e.model.elements.key).toBeUndefined();
		expect(e.selectedIds).toEqual([]);
		e.keyDown({ key: 'z', ctrlKey: true });
		expect(e.model.elements.key).toBeDefined();
		e.keyDown({ key: 'Z', metaKey: true, shiftKey: true });
		expect(e.model.elements.key).toBeUndefined();
	});

	it('arrows move by the grid step, Shift by ten; a held arrow is one undo step', () => {
		const e = editor();
		e.select(['key']);
		e.keyDown({ key: 'ArrowRight' });
		expect(e.model.elements.key.xM).toBeCloseTo(-0.48, 9);
		e.keyDown({ key: 'ArrowDown', shiftKey: true });
		expect(e.model.elements.key.yM).toBeCloseTo(0.2, 9);
		const steps = e.undoSteps;
		e.keyDown({ key: 'ArrowLeft' });
		for (let i = 0; i < 9; i++) e.keyDown({ key: 'ArrowLeft', repeat: true });
		expect(e.model.elements.key.xM).toBeCloseTo(-0.68, 9);
		expect(e.undoSteps).toBe(steps + 1);
		e.undo();
		expect(e.model.elements.key.xM).toBeCloseTo(-0.48, 9);
	});

	it('mod+D duplicates and selects the copy; R turns 15°; A aims; L locks', () => {
		const e = editor();
		e.select(['key']);
		e.keyDown({ key: 'd', ctrlKey: true });
		expect(e.selectedIds).toEqual(['flash-1']);
		e.keyDown({ key: 'r' });
		expect(e.model.elements['flash-1'].rotationDeg).toBeCloseTo(15);
		e.keyDown({ key: 'a' });
		expect(e.model.elements['flash-1'].rotationDeg).not.toBeCloseTo(15);
		e.keyDown({ key: 'l' });
		expect(e.model.elements['flash-1'].locked).toBe(true);
		e.keyDown({ key: 'Delete' });
		expect(e.model.elements['flash-1']).toBeDefined();
		expect(e.lastError?.message).toMatch(/locked/);
	});

	it('Escape clears the selection; unknown keys are left to the page', () => {
		const e = editor();
		e.select(['key']);
		expect(e.keyDown({ key: 'Escape' })).toBe(true);
		expect(e.selectedIds).toEqual([]);
		expect(e.keyDown({ key: 'Escape' })).toBe(false);
		expect(e.keyDown({ key: 'q' })).toBe(false);
		expect(e.keyDown({ key: 'Tab' })).toBe(false);
	});

	it('N and Shift+N walk through the elements; mod+A selects them all', () => {
		const e = editor();
		e.keyDown({ key: 'n' });
		const first = e.selectedIds[0];
		e.keyDown({ key: 'n' });
		expect(e.selectedIds[0]).not.toBe(first);
		e.keyDown({ key: 'N', shiftKey: true });
		expect(e.selectedIds[0]).toBe(first);
		e.keyDown({ key: 'a', ctrlKey: true });
		expect(e.selectedIds).toHaveLength(Object.keys(e.model.elements).length);
	});

	it('every shortcut on the help sheet is matched by its own key and no other', () => {
		const sample: Record<string, Parameters<Editor['keyDown']>[0]> = {
			undo: { key: 'z', ctrlKey: true },
			redo: { key: 'y', ctrlKey: true },
			delete: { key: 'Backspace' },
			'zoom-in': { key: '+' },
			'zoom-out': { key: '-' },
			'select-tool': { key: 'v' },
			'hand-tool': { key: 'h' }
		};
		for (const [action, key] of Object.entries(sample)) {
			expect(SHORTCUTS.filter((s) => s.matches(key)).map((s) => s.action)).toEqual([action]);
		}
	});

	it('+ and − zoom; 0 fits the plan', () => {
		const e = editor();
		e.keyDown({ key: '+' });
		expect(e.viewport.zoom).toBeCloseTo(1250);
		e.keyDown({ key: '-' });
		expect(e.viewport.zoom).toBeCloseTo(1000);
		e.keyDown({ key: '0' });
		expect(e.viewport.zoom).not.toBeCloseTo(1000);
	});
});

describe('Editor: document and session state', () => {
	it('is dirty after a change and clean again when undone or saved', () => {
		const e = editor();
		expect(e.dirty).toBe(false);
		e.select(['key']);
		e.keyDown({ key: 'ArrowUp' });
		expect(e.dirty).toBe(true);
		e.undo();
		expect(e.dirty).toBe(false);
		e.redo();
		e.markSaved();
		expect(e.dirty).toBe(false);
	});

	it('saves the plan, never the selection, zoom or tool', () => {
		const e = editor();
		e.select(['key']);
		e.setTool('hand');
		e.zoomIn();
		const doc = e.toDocument('Quartz on velvet');
		expect(doc.notes).toBe('Quartz on velvet');
		expect(JSON.stringify(doc)).not.toMatch(/"selected|"zoom"|"pan|"hand/);
		const again = new Editor({ document: openDocument(JSON.parse(JSON.stringify(doc))) });
		expect(again.model.elements).toEqual(e.model.elements);
		expect(again.toDocument()).toEqual(JSON.parse(JSON.stringify(doc)));
		expect(again.selectedIds).toEqual([]);
	});

	it('reads typed lengths in the unit system: a bare number is cm or inches', async () => {
		const e = editor();
		expect(await e.parseLength('30 cm')).toEqual({ ok: true, valueM: expect.closeTo(0.3, 12) });
		expect(await e.parseLength('30')).toEqual({ ok: true, valueM: expect.closeTo(0.3, 12) });
		e.unitSystem = 'imperial';
		// 1 in = 25.4 mm exactly (international inch, 1959).
		expect(await e.parseLength('12')).toEqual({ ok: true, valueM: expect.closeTo(0.3048, 12) });
		expect(await e.parseLength('1 ft + 2 in')).toEqual({ ok: true, valueM: expect.closeTo(0.3556, 12) });
		expect(e.formatLength(0.3048)).toBe('12 in');
		const bad = await e.parseLength('twelve');
		expect(bad.ok).toBe(false);
		expect(e.gridStepM).toBeCloseTo(0.5 * 0.0254); // 12.7 px at 1000 px/m
	});

	it('moves an element to typed coordinates as one step, and refuses a locked one', () => {
		const e = editor();
		expect(e.moveElementTo('key', -0.3, 0.1).ok).toBe(true);
		expect([e.model.elements.key.xM, e.model.elements.key.yM]).toEqual([-0.3, 0.1]);
		e.select(['key']);
		e.setLockedSelected(true);
		expect(e.moveElementTo('key', 0, 0).ok).toBe(false);
	});

	it('adds from the palette beside the subject and selects the new element', () => {
		const e = editor();
		const id = e.addElement('reflector');
		expect(id).toBe('reflector-1');
		expect(e.selectedIds).toEqual(['reflector-1']);
		const card = e.model.elements['reflector-1'];
		expect(Math.hypot(card.xM, card.yM)).toBeGreaterThan(0.15);
	});

	it('computes the falloff map only while it is shown', () => {
		const e = editor();
		expect(e.falloff).toBeNull();
		e.falloffVisible = true;
		expect(e.falloff?.reference).toBe('subject');
	});

	it('lays out a new, empty setup with a subject and a camera', () => {
		const e = new Editor();
		expect(Object.values(e.model.elements).map((el) => el.kind).sort()).toEqual(['camera', 'subject']);
		expect(e.scene.lights).toEqual([]);
	});

	it('takes no input after destroy()', () => {
		const e = editor();
		e.destroy();
		e.select(['key']);
		expect(e.keyDown({ key: 'Delete' })).toBe(false);
		expect(e.model.elements.key).toBeDefined();
	});
});
