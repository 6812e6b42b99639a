import { describe, expect, it } from 'vitest';
import { Editor } from './editor.svelte';
import { openDocument } from './model/document';
import { quartzScene } from './test-fixtures';

describe('what the stage draws', () => {
	it('an entry that did not change keeps its object while another element moves', () => {
		const scene = quartzScene();
		scene.lights.push({ id: 'fill', kind: 'flash', position: [0.4, 0.2, 0.1], guideNumber: 20, power: 1 / 4, aim: [0, 0, 0.03] });
		const e = new Editor({ document: openDocument({ scene, plan: {} }) });
		const [keyLine, fillLine] = ['key', 'fill'].map((id) => e.dimensions.find((d) => d.id.includes(id))!);
		const fillBeam = e.beams.find((b) => b.id.includes('fill'))!;
		e.moveElementTo('key', -0.4, 0.05);
		expect(e.dimensions.find((d) => d.id.includes('fill'))).toBe(fillLine);
		expect(e.beams.find((b) => b.id.includes('fill'))).toBe(fillBeam);
		expect(e.dimensions.find((d) => d.id.includes('key'))).not.toBe(keyLine);
	});

	it('the map’s bounds hold every element with a margin', () => {
		const e = new Editor({ document: openDocument({ scene: quartzScene(), plan: {} }) });
		const b = e.planBounds;
		for (const el of e.elements) {
			expect(el.xM).toBeGreaterThan(b.minX);
			expect(el.xM).toBeLessThan(b.maxX);
			expect(el.yM).toBeGreaterThan(b.minY);
			expect(el.yM).toBeLessThan(b.maxY);
		}
	});
});
