/**
 * What a screen reader hears after a change to the plan: the change in words, worked out from the
 * model before and after (so a key, a button, a drag and undo all say what they did), e.g.
 * "Key flash turned to 30°", "White card deleted", "Undone: Key flash moved to 12 cm, -4 cm".
 */
import type { EditorModel } from './model/types';
import type { EditorElement } from './model/schema';

const name = (el: EditorElement) => el.label || el.id;
const degrees = (deg: number) => `${Math.round(deg)}°`;

export function describeChange(before: EditorModel, after: EditorModel, formatLength: (m: number) => string): string | null {
	if (before === after) return null;
	const added = Object.values(after.elements).filter((el) => !before.elements[el.id]);
	const removed = Object.values(before.elements).filter((el) => !after.elements[el.id]);
	const changed = Object.values(after.elements).filter((el) => before.elements[el.id] && before.elements[el.id] !== el);
	const words: string[] = [];
	if (added.length) words.push(added.length === 1 ? `${name(added[0])} added` : `${added.length} elements added`);
	if (removed.length) words.push(removed.length === 1 ? `${name(removed[0])} deleted` : `${removed.length} elements deleted`);
	if (changed.length === 1) {
		const el = changed[0];
		const was = before.elements[el.id];
		if (was.xM !== el.xM || was.yM !== el.yM) words.push(`${name(el)} moved to ${formatLength(el.xM)}, ${formatLength(el.yM)}`);
		else if (was.rotationDeg !== el.rotationDeg) words.push(`${name(el)} turned to ${degrees(el.rotationDeg)}`);
		else if (was.locked !== el.locked) words.push(`${name(el)} ${el.locked ? 'locked' : 'unlocked'}`);
		else if ('tiltDeg' in el && 'tiltDeg' in was && was.tiltDeg !== el.tiltDeg) words.push(`${name(el)} tilted to ${degrees(el.tiltDeg)}`);
		else if (was.zIndex !== el.zIndex) words.push(`${name(el)} drawn in a new order`);
		else words.push(`${name(el)} changed`);
	} else if (changed.length > 1) {
		const moved = changed.every((el) => before.elements[el.id].xM !== el.xM || before.elements[el.id].yM !== el.yM);
		words.push(`${changed.length} elements ${moved ? 'moved' : 'changed'}`);
	}
	if (before.camera !== after.camera) words.push('camera settings changed');
	if (!words.length) return null;
	const text = words.join('; ');
	return text[0].toUpperCase() + text.slice(1) + '.';
}
