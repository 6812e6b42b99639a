/**
 * The words that name a plan's elements and where one stands, for the comparison and the drawings.
 * Every element of a document under its id, and what changed between two revisions' elements, are in
 * placement.ts.
 */
import type { PlanElement } from '$lib/scene/document';

export type Vec3 = readonly [number, number, number];

const KIND_WORDS: Record<string, string> = {
	subject: 'Subject',
	camera: 'Camera',
	flash: 'Flash',
	continuous: 'Continuous light',
	reflector: 'Reflector',
	flag: 'Flag',
	modifier: 'Modifier',
	diffuser: 'Diffuser',
	background: 'Background',
	table: 'Table',
	label: 'Label'
};

export function kindWord(kind: string): string {
	return KIND_WORDS[kind] ?? kind.charAt(0).toUpperCase() + kind.slice(1);
}

/** `Flash “Key in softbox”`: the kind and the element's label (its id when it has none). */
export function elementName(kind: string, label: string): string {
	if (kind === 'subject' || kind === 'camera') return label && label.toLowerCase() !== kind ? `${kindWord(kind)} “${label}”` : kindWord(kind);
	return `${kindWord(kind)} “${label}”`;
}

export function isLight(kind: string): boolean {
	return kind === 'flash' || kind === 'continuous' || kind === 'reflector';
}

/** Where a plan-only element stands: `position` [x, y, z], or the editor's `xM`, `yM`, `heightM`. */
export function planElementPosition(el: PlanElement): Vec3 | null {
	if (el.position) return vec3(el.position);
	if (typeof el.xM === 'number' && typeof el.yM === 'number') return [el.xM, el.yM, typeof el.heightM === 'number' ? el.heightM : 0];
	return null;
}

export function vec3(p: readonly number[] | undefined | null): Vec3 | null {
	if (!p || p.length < 2) return null;
	return [Number(p[0]) || 0, Number(p[1]) || 0, Number(p[2] ?? 0) || 0];
}

export const dist = (a: Vec3, b: Vec3) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
