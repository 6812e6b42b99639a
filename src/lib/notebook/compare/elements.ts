/**
 * The elements of a setup document as the comparison and the drawings see them: every element under
 * its id, with its kind, label and where it stands, and the words that name it.
 */
import { formatDistance, roundSig, type UnitSystem } from '$lib/light/format';
import type { PlanElement, SetupDocument } from '$lib/scene/document';
import type { ElementEntry, MoveEntry, PropertyEntry } from './index';

export type Vec3 = readonly [number, number, number];

/** What the comparison and the drawings read of a setup document: the scene, and the rest where there. */
export type ComparableDocument = Pick<SetupDocument, 'scene'> & Partial<Pick<SetupDocument, 'plan' | 'notes' | 'gear'>>;

/** Anything that stands somewhere on the plan, under one id. */
export interface Placed {
	id: string;
	kind: string;
	label: string;
	position: Vec3 | null;
	rotationDeg?: number;
}

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

/** Every element of a document keyed by id: the subject, lights, flags and plan-only elements. */
export function placedElements(doc: ComparableDocument): Map<string, Placed> {
	const planEls: Record<string, PlanElement | undefined> = doc.plan?.elements ?? {};
	const labelOf = (id: string) => planEls[id]?.label?.trim() || id;
	const out = new Map<string, Placed>();
	out.set('subject', {
		id: 'subject',
		kind: 'subject',
		label: planEls.subject?.label?.trim() || 'subject',
		position: vec3(doc.scene.subject.position)
	});
	for (const light of doc.scene.lights) {
		out.set(light.id, {
			id: light.id,
			kind: light.kind,
			label: labelOf(light.id),
			position: vec3(light.position),
			rotationDeg: planEls[light.id]?.rotationDeg
		});
	}
	for (const flag of doc.scene.flags ?? []) {
		out.set(flag.id, {
			id: flag.id,
			kind: 'flag',
			label: labelOf(flag.id),
			position: [(flag.from[0] + flag.to[0]) / 2, (flag.from[1] + flag.to[1]) / 2, 0],
			rotationDeg: (Math.atan2(flag.to[1] - flag.from[1], flag.to[0] - flag.from[0]) * 180) / Math.PI
		});
	}
	for (const [id, el] of Object.entries(planEls)) {
		if (!el || out.has(id)) continue;
		out.set(id, {
			id,
			kind: el.kind ?? 'label',
			label: el.label?.trim() || id,
			position: planElementPosition(el),
			rotationDeg: el.rotationDeg
		});
	}
	return out;
}

/** The smallest turn from one angle to another, degrees in (−180, 180]. */
function turnDeg(before: number, after: number): number {
	let d = (after - before) % 360;
	if (d > 180) d -= 360;
	if (d <= -180) d += 360;
	return d;
}

/** Elements added, removed and moved or turned (and, for lights, their new distance to the subject). */
export function placementChanges(
	ea: Map<string, Placed>,
	eb: Map<string, Placed>,
	units: UnitSystem,
	thresholdM: number
): { added: ElementEntry[]; removed: ElementEntry[]; moved: MoveEntry[] } {
	const added: ElementEntry[] = [];
	const removed: ElementEntry[] = [];
	const moved: MoveEntry[] = [];
	const subjectA = ea.get('subject')!.position!;
	const subjectB = eb.get('subject')!.position!;

	for (const [id, el] of eb) {
		const before = ea.get(id);
		if (!before || before.kind !== el.kind) {
			const name = elementName(el.kind, el.label);
			const where = el.position && isLight(el.kind) ? ` ${formatDistance(dist(el.position, subjectB), units)} from the subject` : '';
			added.push({ id, kind: el.kind, label: el.label, text: `${name} added${where}` });
		}
	}
	for (const [id, el] of ea) {
		const after = eb.get(id);
		if (!after || after.kind !== el.kind) removed.push({ id, kind: el.kind, label: el.label, text: `${elementName(el.kind, el.label)} removed` });
	}
	for (const [id, after] of eb) {
		const before = ea.get(id);
		if (!before || before.kind !== after.kind) continue;
		const name = elementName(after.kind, after.label);
		let distanceM = 0;
		let heightChangeM = 0;
		if (before.position && after.position) {
			distanceM = dist(before.position, after.position);
			heightChangeM = after.position[2] - before.position[2];
		}
		const rotationChangeDeg =
			before.rotationDeg !== undefined && after.rotationDeg !== undefined ? turnDeg(before.rotationDeg, after.rotationDeg) : 0;
		const movedFar = distanceM >= thresholdM;
		const turned = Math.abs(rotationChangeDeg) >= 0.5 && after.kind !== 'flag';
		if (!movedFar && !turned) continue;
		const parts: string[] = [];
		if (movedFar) {
			let t = `${name} moved ${formatDistance(distanceM, units)}`;
			if (Math.abs(heightChangeM) >= thresholdM) t += ` (${heightChangeM > 0 ? 'raised' : 'lowered'} ${formatDistance(Math.abs(heightChangeM), units)})`;
			parts.push(t);
		} else {
			parts.push(name);
		}
		if (turned) parts.push(`${movedFar ? 'and ' : ''}turned ${roundSig(Math.abs(rotationChangeDeg), 3)}° ${rotationChangeDeg > 0 ? 'anticlockwise' : 'clockwise'}`);
		const entry: MoveEntry = { id, kind: after.kind, label: after.label, text: parts.join(' '), distanceM, heightChangeM };
		if (turned) entry.rotationChangeDeg = rotationChangeDeg;
		if (isLight(after.kind) && before.position && after.position) {
			const sd = { before: dist(before.position, subjectA), after: dist(after.position, subjectB) };
			entry.subjectDistanceM = sd;
			if (Math.abs(sd.after - sd.before) >= thresholdM)
				entry.text += `: now ${formatDistance(sd.after, units)} from the subject (was ${formatDistance(sd.before, units)})`;
		}
		moved.push(entry);
	}
	return { added, removed, moved };
}

/** Labels renamed on the plan, and sizes drawn on it (a card made larger, a wider background). */
export function drawingChanges(a: ComparableDocument, b: ComparableDocument, ea: Map<string, Placed>, eb: Map<string, Placed>, units: UnitSystem): PropertyEntry[] {
	const out: PropertyEntry[] = [];
	for (const [id, after] of eb) {
		const before = ea.get(id);
		if (before && before.kind === after.kind && before.label !== after.label && id !== 'subject') {
			out.push({
				id,
				kind: after.kind,
				label: after.label,
				property: 'label',
				before: before.label,
				after: after.label,
				text: `${elementName(after.kind, before.label)} renamed “${after.label}”`
			});
		}
	}
	const planA = a.plan?.elements ?? {};
	const planB = b.plan?.elements ?? {};
	const size = (el: PlanElement) => (['widthM', 'depthM', 'heightM'] as const).map((k) => (typeof el[k] === 'number' ? el[k] : null));
	const sizeText = (s: (number | null)[]) => s.filter((v): v is number => v !== null).map((v) => formatDistance(v, units)).join(' × ') || 'no size';
	for (const [id, after] of eb) {
		const before = ea.get(id);
		const pa = planA[id];
		const pb = planB[id];
		if (!before || before.kind !== after.kind || !pa || !pb) continue;
		const sa = size(pa);
		const sb = size(pb);
		if (sa.some((v, i) => v !== sb[i])) {
			out.push({
				id,
				kind: after.kind,
				label: after.label,
				property: 'size',
				before: sa,
				after: sb,
				text: `${elementName(after.kind, after.label)} resized ${sizeText(sa)} → ${sizeText(sb)}`
			});
		}
	}
	return out;
}
