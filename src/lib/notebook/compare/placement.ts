/**
 * Every element of a setup document under its id (the subject, lights, flags and plan-only elements),
 * and the elements added, removed, moved, turned, renamed and resized between two revisions.
 */
import { formatDistance, roundSig, type UnitSystem } from '$lib/light/format';
import type { PlanElement, SetupDocument } from '$lib/scene/document';
import { dist, elementName, isLight, planElementPosition, vec3, type Vec3 } from './elements';
import type { ElementEntry, MoveEntry, PropertyEntry } from './index';

/** What the comparison reads of a setup document: the scene, and the rest where there. */
export type ComparableDocument = Pick<SetupDocument, 'scene'> & Partial<Pick<SetupDocument, 'plan' | 'notes' | 'gear'>>;

/** Anything that stands somewhere on the plan, under one id. */
export interface Placed {
	id: string;
	kind: string;
	label: string;
	position: Vec3 | null;
	rotationDeg?: number;
}

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
