/**
 * Every element of a setup document under its id (the subject, lights, flags and plan-only elements),
 * and the elements added, removed, moved, turned, renamed and resized between two revisions.
 */
import { formatDistance, type UnitSystem } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import type { PlanElement, SetupDocument } from '$lib/scene/document';
import { dist, elementName, isLight, planElementPosition, vec3, type Vec3 } from './elements';
import type { ElementEntry, MoveEntry, PropertyEntry } from './index';
import { areaText } from './lights';
import { shownChange, shownDegrees } from './shown';

/** What the comparison reads of a setup document: the scene, and the rest where there. */
export type ComparableDocument = Pick<SetupDocument, 'scene'> & Partial<Pick<SetupDocument, 'plan' | 'notes' | 'gear'>>;

/** Anything that stands somewhere on the plan, under one id. */
export interface Placed {
	id: string;
	kind: string;
	label: string;
	position: Vec3 | null;
	rotationDeg?: number;
	/** Where a light points in 3-D (a beam's aim, a card's normal), when the scene sets it. Unit length. */
	facing?: Vec3;
}

function unit(v: Vec3): Vec3 | undefined {
	const l = Math.hypot(v[0], v[1], v[2]);
	return l > 0 ? [v[0] / l, v[1] / l, v[2] / l] : undefined;
}

/** A light's facing: towards its aim point, or along a card's normal. */
function facingOf(light: ExposureScene['lights'][number]): Vec3 | undefined {
	if (light.kind === 'reflector') return light.normal ? unit(vec3(light.normal)!) : undefined;
	if (!light.aim) return undefined;
	const p = vec3(light.position)!;
	const aim = vec3(light.aim)!;
	return unit([aim[0] - p[0], aim[1] - p[1], aim[2] - p[2]]);
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
		position: vec3(doc.scene.subject.position),
		rotationDeg: planEls.subject?.rotationDeg
	});
	for (const light of doc.scene.lights) {
		out.set(light.id, {
			id: light.id,
			kind: light.kind,
			label: labelOf(light.id),
			position: vec3(light.position),
			rotationDeg: planEls[light.id]?.rotationDeg,
			facing: facingOf(light)
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

const DEG = 180 / Math.PI;
const bearingDeg = (v: Vec3) => Math.atan2(v[1], v[0]) * DEG;
const elevationDeg = (v: Vec3) => Math.asin(Math.max(-1, Math.min(1, v[2]))) * DEG;

/** How a turn reads: `turned 20° clockwise`. */
const turnText = (deg: number) => `turned ${shownDegrees(deg)}° ${deg > 0 ? 'anticlockwise' : 'clockwise'}`;

/** The change of a plan rotation, or of a flag's line (which has no front: within ±90°). */
function planTurn(before: Placed, after: Placed): number | null {
	if (before.rotationDeg === undefined || after.rotationDeg === undefined) return null;
	let d = turnDeg(before.rotationDeg, after.rotationDeg);
	if (after.kind === 'flag') d = d > 90 ? d - 180 : d <= -90 ? d + 180 : d;
	return shownDegrees(d) === 0 ? null : d;
}

/**
 * How an element turned, in whole degrees (null under one degree), said once. A light whose scene
 * sets where it points (a beam's aim, a card's normal) on both sides is measured by that, the light's
 * truth: its plan rotation is only a drawing of it and may disagree with it in a document the editor
 * has not written. A light that gains or loses a set direction says so here, with its plan turn.
 * Anything else turns by its plan rotation.
 */
function turnBetween(before: Placed, after: Placed): { deg?: number; text: string } | null {
	if (before.facing && after.facing) {
		const cos = before.facing[0] * after.facing[0] + before.facing[1] * after.facing[1] + before.facing[2] * after.facing[2];
		const angle = Math.acos(Math.max(-1, Math.min(1, cos))) * DEG;
		if (shownDegrees(angle) === 0) return null;
		const sideways = turnDeg(bearingDeg(before.facing), bearingDeg(after.facing));
		const upwards = elevationDeg(after.facing) - elevationDeg(before.facing);
		const how =
			shownDegrees(sideways) >= shownDegrees(upwards)
				? sideways > 0 ? 'anticlockwise' : 'clockwise'
				: upwards > 0 ? 'upwards' : 'downwards';
		return { deg: sideways, text: `turned ${shownDegrees(angle)}° ${how}` };
	}
	const d = planTurn(before, after);
	if (Boolean(before.facing) !== Boolean(after.facing)) {
		const card = after.kind === 'reflector';
		const now = after.facing
			? card ? 'now faces a set direction' : 'now aimed along a set direction'
			: card ? 'now faces both its source and the subject' : 'now aimed at the subject';
		return { deg: d ?? undefined, text: d === null ? now : `${turnText(d)} (${now})` };
	}
	return d === null ? null : { deg: d, text: turnText(d) };
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
		const turn = turnBetween(before, after);
		const movedFar = formatDistance(distanceM, units) !== formatDistance(0, units) && distanceM >= thresholdM;
		if (!movedFar && !turn) continue;
		const parts: string[] = [];
		if (movedFar) {
			let t = `${name} moved ${formatDistance(distanceM, units)}`;
			if (Math.abs(heightChangeM) >= thresholdM) t += ` (${heightChangeM > 0 ? 'raised' : 'lowered'} ${formatDistance(Math.abs(heightChangeM), units)})`;
			parts.push(t);
		} else {
			parts.push(name);
		}
		if (turn) parts.push(`${movedFar ? 'and ' : ''}${turn.text}`);
		const rotationChangeDeg = turn?.deg;
		const entry: MoveEntry = { id, kind: after.kind, label: after.label, text: parts.join(' '), distanceM, heightChangeM };
		if (rotationChangeDeg !== undefined) entry.rotationChangeDeg = rotationChangeDeg;
		if (isLight(after.kind) && before.position && after.position) {
			const sd = { before: dist(before.position, subjectA), after: dist(after.position, subjectB) };
			entry.subjectDistanceM = sd;
			if (Math.abs(sd.after - sd.before) >= thresholdM && formatDistance(sd.after, units) !== formatDistance(sd.before, units))
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
		if (before && before.kind === after.kind && before.label !== after.label) {
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
	const reflectorsA = new Map(a.scene.lights.flatMap((l) => (l.kind === 'reflector' ? [[l.id, l] as const] : [])));
	const reflectorsB = new Map(b.scene.lights.flatMap((l) => (l.kind === 'reflector' ? [[l.id, l] as const] : [])));
	for (const [id, after] of eb) {
		const before = ea.get(id);
		if (!before || before.kind !== after.kind) continue;
		const sizes = sizeChange(after.kind, planA[id], planB[id], units);
		const ra = reflectorsA.get(id);
		const rb = reflectorsB.get(id);
		const area = ra && rb ? shownChange(ra.areaM2, rb.areaM2, (v) => areaText(v, units)) : null;
		if (!sizes && !area) continue;
		const text = sizes ? ` resized ${sizes.text}${area ? ` (area ${area})` : ''}` : `: area ${area}`;
		out.push({
			id,
			kind: after.kind,
			label: after.label,
			property: sizes ? 'size' : 'areaM2',
			before: sizes?.before ?? ra?.areaM2,
			after: sizes?.after ?? rb?.areaM2,
			text: `${elementName(after.kind, after.label)}${text}`
		});
	}
	return out;
}

/** A panel (card, diffuser, flag) stands upright: its face is width × height; anything else lies flat. */
const PANEL_KINDS = new Set(['reflector', 'diffuser', 'flag']);

/**
 * A drawn size that changed, as printed: only dimensions both revisions give are compared (one the plan
 * lacks is drawn at the editor's default, which is not a change anyone made).
 */
function sizeChange(kind: string, pa: PlanElement | undefined, pb: PlanElement | undefined, units: UnitSystem) {
	if (!pa || !pb) return null;
	const given = (k: 'widthM' | 'depthM' | 'heightM') => typeof pa[k] === 'number' && typeof pb[k] === 'number';
	// A panel's face is its width and height together: a width alone (with the height at a default) is
	// half a size, and the editor may fit it to the card's area.
	const panel = PANEL_KINDS.has(kind);
	if (panel && !(given('widthM') && given('heightM'))) return null;
	const both = panel ? (['widthM', 'heightM'] as const) : (['widthM', 'depthM', 'heightM'] as const).filter(given);
	const side = (el: PlanElement) => both.map((k) => formatDistance(el[k] as number, units)).join(' × ');
	const text = both.length ? shownChange(pa, pb, side) : null;
	if (!text) return null;
	return { text, before: both.map((k) => pa[k]), after: both.map((k) => pb[k]) };
}
