/**
 * The comparison of two revisions of a setup, in words: elements added, removed and moved (and by how
 * far), what changed on a light, the camera and ambient settings, the notes, and the change in exposure
 * in stops, computed with the light engine from both documents.
 *
 * Pure: plain documents in, plain sentences and numbers out. The history pages render it; the setup
 * page uses it to show what changed under a stale save.
 */
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { formatDistance, formatFNumber, formatShutter, formatStops, roundSig, type UnitSystem } from '$lib/light/format';
import { nearestPowerStep } from '$lib/light/flash';
import type { ExposureScene, SceneLight } from '$lib/light/schema';

type Vec3 = readonly [number, number, number];

/** The parts of a setup document the comparison reads (the full schema lives in `$lib/scene`). */
export interface ComparableDocument {
	scene: ExposureScene;
	plan?: { elements?: Record<string, PlanElementLike | undefined> } & Record<string, unknown>;
	notes?: string;
	gear?: { id: string; kind: string; name: string }[];
}

export interface PlanElementLike {
	kind?: string;
	label?: string;
	position?: readonly number[];
	xM?: number;
	yM?: number;
	rotationDeg?: number;
	widthM?: number;
	depthM?: number;
	heightM?: number;
	[key: string]: unknown;
}

/** Anything that stands somewhere on the plan, under one id. */
interface Placed {
	id: string;
	kind: string;
	label: string;
	position: Vec3 | null;
	rotationDeg?: number;
}

export interface ElementEntry {
	id: string;
	kind: string;
	label: string;
	text: string;
}

export interface MoveEntry extends ElementEntry {
	/** Straight-line distance the element moved, metres (3-D). */
	distanceM: number;
	/** Height change, metres (positive = raised). */
	heightChangeM: number;
	/** For lights: distance to the subject before and after, metres. */
	subjectDistanceM?: { before: number; after: number };
	rotationChangeDeg?: number;
}

export interface PropertyEntry extends ElementEntry {
	property: string;
	before: unknown;
	after: unknown;
}

export interface SettingEntry {
	setting: string;
	before: unknown;
	after: unknown;
	text: string;
}

export interface LightExposureEntry {
	id: string;
	label: string;
	beforeStops: number | null;
	afterStops: number | null;
	/** null when either side gives no light. */
	deltaStops: number | null;
	text: string;
}

export interface ExposureChange {
	beforeStops: number | null;
	afterStops: number | null;
	deltaStops: number | null;
	text: string;
	lights: LightExposureEntry[];
	keyLight: { before: string | null; after: string | null; text: string | null };
	lightingRatio: { before: number | null; after: number | null; text: string | null };
	/** One of the documents could not be computed (should not happen with validated documents). */
	error?: string;
}

export interface NotesChange {
	changed: boolean;
	linesAdded: number;
	linesRemoved: number;
	text: string | null;
	lines: LineDiffOp[];
}

export interface Comparison {
	added: ElementEntry[];
	removed: ElementEntry[];
	moved: MoveEntry[];
	altered: PropertyEntry[];
	settings: SettingEntry[];
	notes: NotesChange;
	gear: ElementEntry[];
	exposure: ExposureChange;
	/** Nothing at all differs between the two documents. */
	identical: boolean;
	/** The plan drawing differs only in ways named above by none of the lists (colours, layout hints). */
	planOnlyChange: boolean;
}

export interface CompareOptions {
	unitSystem?: UnitSystem;
	/** Moves shorter than this are ignored (rounding in a drag), metres. Default 1 mm. */
	moveThresholdM?: number;
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

/** Where a plan-only element stands: `position` [x, y, z], or the editor's `xM`, `yM`, `heightM`. */
export function planElementPosition(el: PlanElementLike): Vec3 | null {
	if (el.position) return vec3(el.position);
	if (typeof el.xM === 'number' && typeof el.yM === 'number') return [el.xM, el.yM, typeof el.heightM === 'number' ? el.heightM : 0];
	return null;
}

function vec3(p: readonly number[] | undefined | null): Vec3 | null {
	if (!p || p.length < 2) return null;
	return [Number(p[0]) || 0, Number(p[1]) || 0, Number(p[2] ?? 0) || 0];
}

const dist = (a: Vec3, b: Vec3) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

/** Every element of a document keyed by id: the subject, lights, flags and plan-only elements. */
export function placedElements(doc: ComparableDocument): Map<string, Placed> {
	const planEls = doc.plan?.elements ?? {};
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

/** A flash power as the ladder labels it (`1/4`, `1/8 +0.3`), or a plain fraction between steps. */
export function powerLabel(power: number): string {
	const step = nearestPowerStep(power);
	if (Math.abs(step.residualStops) < 0.02) return step.label;
	return `${roundSig(power, 2)} of full`;
}

const stopsBetween = (before: number, after: number) => Math.log2(after / before);

function signedStops(stops: number): string {
	return formatStops(stops);
}

function percent(v: number): string {
	return `${roundSig(v * 100, 3)} %`;
}

/** A light's properties, compared one by one. */
function lightPropertyChanges(a: SceneLight, b: SceneLight, name: string, units: UnitSystem): PropertyEntry[] {
	const out: PropertyEntry[] = [];
	const push = (property: string, before: unknown, after: unknown, text: string) =>
		out.push({ id: b.id, kind: b.kind, label: name, property, before, after, text: `${name}: ${text}` });
	if (a.kind === 'flash' && b.kind === 'flash') {
		if (a.power !== b.power) push('power', a.power, b.power, `power ${powerLabel(a.power)} → ${powerLabel(b.power)} (${signedStops(stopsBetween(a.power, b.power))})`);
		if (a.guideNumber !== b.guideNumber)
			push('guideNumber', a.guideNumber, b.guideNumber, `guide number ${roundSig(a.guideNumber)} → ${roundSig(b.guideNumber)} m (${signedStops(2 * stopsBetween(a.guideNumber, b.guideNumber))})`);
		if ((a.highSpeedSync ?? false) !== (b.highSpeedSync ?? false)) push('highSpeedSync', a.highSpeedSync ?? false, b.highSpeedSync ?? false, b.highSpeedSync ? 'high-speed sync turned on' : 'high-speed sync turned off');
	}
	if (a.kind === 'continuous' && b.kind === 'continuous' && a.luxAt1m !== b.luxAt1m) {
		push('luxAt1m', a.luxAt1m, b.luxAt1m, `output ${roundSig(a.luxAt1m)} → ${roundSig(b.luxAt1m)} lux at 1 m (${signedStops(stopsBetween(a.luxAt1m, b.luxAt1m))})`);
	}
	if (a.kind !== 'reflector' && b.kind !== 'reflector') {
		const la = a.lossStops ?? 0;
		const lb = b.lossStops ?? 0;
		if (la !== lb) push('lossStops', la, lb, `modifier and gel loss ${roundSig(la, 2)} → ${roundSig(lb, 2)} stops`);
		if (a.kelvin !== b.kelvin) push('kelvin', a.kelvin ?? null, b.kelvin ?? null, `colour temperature ${a.kelvin ? `${a.kelvin} K` : 'not set'} → ${b.kelvin ? `${b.kelvin} K` : 'not set'}`);
		if ((a.gelMired ?? 0) !== (b.gelMired ?? 0)) push('gelMired', a.gelMired ?? 0, b.gelMired ?? 0, `gel ${a.gelMired ? `${a.gelMired} mired` : 'none'} → ${b.gelMired ? `${b.gelMired} mired` : 'none'}`);
		if (a.beamAngleDeg !== b.beamAngleDeg) push('beamAngleDeg', a.beamAngleDeg ?? null, b.beamAngleDeg ?? null, `beam angle ${a.beamAngleDeg ? `${a.beamAngleDeg}°` : 'not set'} → ${b.beamAngleDeg ? `${b.beamAngleDeg}°` : 'not set'}`);
		const aimA = vec3(a.aim);
		const aimB = vec3(b.aim);
		if ((aimA === null) !== (aimB === null) || (aimA && aimB && dist(aimA, aimB) >= 0.001)) {
			push('aim', a.aim ?? null, b.aim ?? null, aimB ? (aimA ? `re-aimed (the aim point moved ${formatDistance(dist(aimA, aimB), units)})` : 'now aimed at a point off the subject') : 'now aimed at the subject');
		}
	}
	if (a.kind === 'reflector' && b.kind === 'reflector') {
		if (a.areaM2 !== b.areaM2) push('areaM2', a.areaM2, b.areaM2, `area ${areaText(a.areaM2, units)} → ${areaText(b.areaM2, units)}`);
		if (a.reflectance !== b.reflectance) push('reflectance', a.reflectance, b.reflectance, `reflectance ${percent(a.reflectance)} → ${percent(b.reflectance)}`);
		if (a.surface !== b.surface) push('surface', a.surface, b.surface, `surface ${a.surface} → ${b.surface}`);
		if (a.source !== b.source) push('source', a.source, b.source, `now bounces “${b.source}” instead of “${a.source}”`);
		const na = vec3(a.normal);
		const nb = vec3(b.normal);
		if ((na === null) !== (nb === null) || (na && nb && angleDeg(na, nb) >= 0.5)) {
			push('normal', a.normal ?? null, b.normal ?? null, na && nb ? `turned ${roundSig(angleDeg(na, nb), 2)}°` : nb ? 'now faces a set direction' : 'now faces both its source and the subject');
		}
	}
	return out;
}

function angleDeg(a: Vec3, b: Vec3): number {
	const la = Math.hypot(...a);
	const lb = Math.hypot(...b);
	if (la === 0 || lb === 0) return 0;
	const c = Math.min(1, Math.max(-1, (a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) / (la * lb)));
	return (Math.acos(c) * 180) / Math.PI;
}

function areaText(areaM2: number, units: UnitSystem): string {
	if (units === 'imperial') return `${roundSig(areaM2 / 0.0254 ** 2, 3)} sq in`;
	return areaM2 < 1 ? `${roundSig(areaM2 * 1e4, 3)} cm²` : `${roundSig(areaM2, 3)} m²`;
}

/** The camera, subject and ambient settings, compared field by field. */
function settingChanges(a: ExposureScene, b: ExposureScene): SettingEntry[] {
	const out: SettingEntry[] = [];
	const push = (setting: string, before: unknown, after: unknown, text: string) => out.push({ setting, before, after, text });
	const ca = a.camera;
	const cb = b.camera;
	if (ca.iso !== cb.iso) push('iso', ca.iso, cb.iso, `ISO ${ca.iso} → ${cb.iso} (${signedStops(stopsBetween(ca.iso, cb.iso))})`);
	if (ca.aperture !== cb.aperture)
		push('aperture', ca.aperture, cb.aperture, `Aperture ${formatFNumber(ca.aperture)} → ${formatFNumber(cb.aperture)} (${signedStops(-2 * stopsBetween(ca.aperture, cb.aperture))} of light)`);
	if (ca.shutter !== cb.shutter)
		push('shutter', ca.shutter, cb.shutter, `Shutter speed ${formatShutter(ca.shutter)} → ${formatShutter(cb.shutter)} (${signedStops(stopsBetween(ca.shutter, cb.shutter))} of ambient)`);
	if (ca.magnification !== cb.magnification)
		push('magnification', ca.magnification, cb.magnification, `Magnification ${roundSig(ca.magnification)}× → ${roundSig(cb.magnification)}×`);
	const optional: [keyof typeof ca, string, (v: number) => string][] = [
		['pupilMagnification', 'Pupil magnification', (v) => `${roundSig(v)}`],
		['cocMm', 'Circle of confusion', (v) => `${roundSig(v * 1000)} µm`],
		['wavelengthNm', 'Wavelength for diffraction', (v) => `${roundSig(v)} nm`],
		['lossStops', 'Lens filter loss', (v) => `${roundSig(v, 2)} stops`],
		['syncSpeed', 'Sync speed', (v) => formatShutter(v)],
		['minAperture', 'Widest aperture in the table', (v) => formatFNumber(v)],
		['maxAperture', 'Narrowest aperture in the table', (v) => formatFNumber(v)]
	];
	for (const [key, name, fmt] of optional) {
		const va = ca[key] as number | undefined;
		const vb = cb[key] as number | undefined;
		if (va !== vb) push(key, va ?? null, vb ?? null, `${name} ${va === undefined ? 'not set' : fmt(va)} → ${vb === undefined ? 'not set' : fmt(vb)}`);
	}
	if ((ca.centreColumn ?? 'down') !== (cb.centreColumn ?? 'down'))
		push('centreColumn', ca.centreColumn ?? 'down', cb.centreColumn ?? 'down', `Tripod centre column ${ca.centreColumn ?? 'down'} → ${cb.centreColumn ?? 'down'}`);
	const aa = a.ambient;
	const ab = b.ambient;
	if (!aa && ab) push('ambient', null, ab.ev100, `Ambient light added: EV ${roundSig(ab.ev100, 3)} at ISO 100`);
	else if (aa && !ab) push('ambient', aa.ev100, null, `Ambient light removed (was EV ${roundSig(aa.ev100, 3)})`);
	else if (aa && ab) {
		if (aa.ev100 !== ab.ev100) push('ambient.ev100', aa.ev100, ab.ev100, `Ambient EV ${roundSig(aa.ev100, 3)} → ${roundSig(ab.ev100, 3)} (${signedStops(ab.ev100 - aa.ev100)})`);
		if (aa.kelvin !== ab.kelvin) push('ambient.kelvin', aa.kelvin ?? null, ab.kelvin ?? null, `Ambient colour temperature ${aa.kelvin ? `${aa.kelvin} K` : 'not set'} → ${ab.kelvin ? `${ab.kelvin} K` : 'not set'}`);
	}
	if ((a.subject.living ?? false) !== (b.subject.living ?? false))
		push('subject.living', a.subject.living ?? false, b.subject.living ?? false, b.subject.living ? 'The subject is now marked as a living person or animal' : 'The subject is no longer marked as living');
	return out;
}

// ---------- notes: a line diff ----------

export type LineDiffOp = { op: 'same' | 'added' | 'removed'; line: string };

/** A longest-common-subsequence diff of two texts by line (notes are short; this is plenty). */
export function diffLines(before: string, after: string): LineDiffOp[] {
	const a = before === '' ? [] : before.split(/\r?\n/);
	const b = after === '' ? [] : after.split(/\r?\n/);
	// Trim the common head and tail first so a long note with one change stays cheap.
	let head = 0;
	while (head < a.length && head < b.length && a[head] === b[head]) head++;
	let tail = 0;
	while (tail < a.length - head && tail < b.length - head && a[a.length - 1 - tail] === b[b.length - 1 - tail]) tail++;
	const midA = a.slice(head, a.length - tail);
	const midB = b.slice(head, b.length - tail);
	const n = midA.length;
	const m = midB.length;
	const ops: LineDiffOp[] = a.slice(0, head).map((line) => ({ op: 'same', line }));
	if (n * m > 4_000_000) {
		// Too large to align line by line: say everything in between changed.
		for (const line of midA) ops.push({ op: 'removed', line });
		for (const line of midB) ops.push({ op: 'added', line });
	} else {
		const lcs: Uint32Array[] = Array.from({ length: n + 1 }, () => new Uint32Array(m + 1));
		for (let i = n - 1; i >= 0; i--)
			for (let j = m - 1; j >= 0; j--) lcs[i][j] = midA[i] === midB[j] ? lcs[i + 1][j + 1] + 1 : Math.max(lcs[i + 1][j], lcs[i][j + 1]);
		let i = 0;
		let j = 0;
		while (i < n || j < m) {
			if (i < n && j < m && midA[i] === midB[j]) {
				ops.push({ op: 'same', line: midA[i] });
				i++;
				j++;
			} else if (j < m && (i === n || lcs[i][j + 1] >= lcs[i + 1][j])) {
				ops.push({ op: 'added', line: midB[j++] });
			} else {
				ops.push({ op: 'removed', line: midA[i++] });
			}
		}
	}
	for (const line of a.slice(a.length - tail)) ops.push({ op: 'same', line });
	return ops;
}

function notesChange(before: string, after: string): NotesChange {
	if (before === after) return { changed: false, linesAdded: 0, linesRemoved: 0, text: null, lines: [] };
	const lines = diffLines(before, after);
	const linesAdded = lines.filter((l) => l.op === 'added').length;
	const linesRemoved = lines.filter((l) => l.op === 'removed').length;
	let text: string;
	if (before.trim() === '') text = 'Notes written';
	else if (after.trim() === '') text = 'Notes cleared';
	else {
		const parts = [];
		if (linesAdded) parts.push(`${linesAdded} ${linesAdded === 1 ? 'line' : 'lines'} added`);
		if (linesRemoved) parts.push(`${linesRemoved} ${linesRemoved === 1 ? 'line' : 'lines'} removed`);
		text = `Notes changed${parts.length ? ` (${parts.join(', ')})` : ' (spacing only)'}`;
	}
	return { changed: true, linesAdded, linesRemoved, text, lines };
}

// ---------- exposure ----------

function safeExposure(scene: ExposureScene): ExposureResult | string {
	try {
		return computeExposure(scene);
	} catch (e) {
		return e instanceof Error ? e.message : 'could not be computed';
	}
}

function ratioText(r: number | null): string {
	return r === null ? 'none (one light)' : `${roundSig(r, 2)} : 1`;
}

function exposureChange(a: ComparableDocument, b: ComparableDocument, labelOf: (id: string) => string): ExposureChange {
	const ea = safeExposure(a.scene);
	const eb = safeExposure(b.scene);
	if (typeof ea === 'string' || typeof eb === 'string') {
		const error = typeof ea === 'string' ? ea : (eb as string);
		return {
			beforeStops: null,
			afterStops: null,
			deltaStops: null,
			text: `The exposure could not be computed: ${error}`,
			lights: [],
			keyLight: { before: null, after: null, text: null },
			lightingRatio: { before: null, after: null, text: null },
			error
		};
	}
	const before = ea.total.exposureOffsetStops;
	const after = eb.total.exposureOffsetStops;
	const delta = before !== null && after !== null ? after - before : null;
	let text: string;
	const at = (doc: ComparableDocument) => formatFNumber(doc.scene.camera.aperture);
	if (before === null && after === null) text = 'No light reaches the subject in either revision.';
	else if (before === null) text = `Exposure: no light before; now ${formatStops(after)} at ${at(b)}.`;
	else if (after === null) text = `Exposure: ${formatStops(before)} at ${at(a)} before; now no light reaches the subject.`;
	else if (Math.abs(delta!) < 0.05) text = `Exposure unchanged: ${formatStops(after)} at ${at(b)}.`;
	else text = `Exposure ${formatStops(delta)}: ${formatStops(before)} at ${at(a)} → ${formatStops(after)} at ${at(b)}.`;

	const lights: LightExposureEntry[] = [];
	const byIdA = new Map(ea.lights.map((l) => [l.id, l]));
	for (const lb of eb.lights) {
		const la = byIdA.get(lb.id);
		if (!la) continue;
		const d = la.stops !== null && lb.stops !== null ? lb.stops - la.stops : null;
		const same = la.stops === lb.stops || (d !== null && Math.abs(d) < 0.05);
		if (same) continue;
		const name = labelOf(lb.id);
		let t: string;
		if (d !== null) t = `${name}: ${formatStops(d)} (${formatStops(la.stops)} → ${formatStops(lb.stops)})`;
		else if (lb.stops === null) t = `${name}: no longer reaches the subject${lb.blocked ? ` (blocked by a flag)` : ''}`;
		else t = `${name}: now reaches the subject (${formatStops(lb.stops)})`;
		lights.push({ id: lb.id, label: name, beforeStops: la.stops, afterStops: lb.stops, deltaStops: d, text: t });
	}
	const keyText =
		ea.keyLightId === eb.keyLightId
			? null
			: `Key light ${ea.keyLightId ? labelOf(ea.keyLightId) : 'none'} → ${eb.keyLightId ? labelOf(eb.keyLightId) : 'none'}`;
	const ra = ea.lightingRatio;
	const rb = eb.lightingRatio;
	const ratioChanged = (ra === null) !== (rb === null) || (ra !== null && rb !== null && Math.abs(Math.log2(rb / ra)) >= 0.05);
	return {
		beforeStops: before,
		afterStops: after,
		deltaStops: delta,
		text,
		lights,
		keyLight: { before: ea.keyLightId, after: eb.keyLightId, text: keyText },
		lightingRatio: { before: ra, after: rb, text: ratioChanged ? `Lighting ratio ${ratioText(ra)} → ${ratioText(rb)}` : null }
	};
}

// ---------- the whole comparison ----------

/** Compares revision `a` (before) with revision `b` (after). */
export function compareDocuments(a: ComparableDocument, b: ComparableDocument, options: CompareOptions = {}): Comparison {
	const units = options.unitSystem ?? 'metric';
	const threshold = options.moveThresholdM ?? 0.001;
	const ea = placedElements(a);
	const eb = placedElements(b);
	const labelOf = (id: string) => {
		if (id === 'ambient') return 'Ambient light';
		const el = eb.get(id) ?? ea.get(id);
		return el ? elementName(el.kind, el.label) : `“${id}”`;
	};

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
		const movedFar = distanceM >= threshold;
		const turned = Math.abs(rotationChangeDeg) >= 0.5 && after.kind !== 'flag';
		if (!movedFar && !turned) continue;
		const parts: string[] = [];
		if (movedFar) {
			let t = `${name} moved ${formatDistance(distanceM, units)}`;
			if (Math.abs(heightChangeM) >= threshold) t += ` (${heightChangeM > 0 ? 'raised' : 'lowered'} ${formatDistance(Math.abs(heightChangeM), units)})`;
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
			if (Math.abs(sd.after - sd.before) >= threshold)
				entry.text += `: now ${formatDistance(sd.after, units)} from the subject (was ${formatDistance(sd.before, units)})`;
		}
		moved.push(entry);
	}

	const altered: PropertyEntry[] = [];
	const lightsA = new Map(a.scene.lights.map((l) => [l.id, l]));
	for (const lb of b.scene.lights) {
		const la = lightsA.get(lb.id);
		if (!la || la.kind !== lb.kind) continue;
		altered.push(...lightPropertyChanges(la, lb, labelOf(lb.id), units));
	}
	// Labels renamed on the plan.
	for (const [id, after] of eb) {
		const before = ea.get(id);
		if (before && before.kind === after.kind && before.label !== after.label && id !== 'subject') {
			altered.push({
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

	// Sizes drawn on the plan (a card made larger, a background swapped for a wider one).
	const planA = a.plan?.elements ?? {};
	const planB = b.plan?.elements ?? {};
	for (const [id, after] of eb) {
		const before = ea.get(id);
		const pa = planA[id];
		const pb = planB[id];
		if (!before || before.kind !== after.kind || !pa || !pb) continue;
		const size = (el: PlanElementLike) =>
			(['widthM', 'depthM', 'heightM'] as const).map((k) => (typeof el[k] === 'number' ? (el[k] as number) : null));
		const sa = size(pa);
		const sb = size(pb);
		if (sa.some((v, i) => v !== sb[i])) {
			const fmt = (s: (number | null)[]) => s.filter((v): v is number => v !== null).map((v) => formatDistance(v, units)).join(' × ') || 'no size';
			altered.push({
				id,
				kind: after.kind,
				label: after.label,
				property: 'size',
				before: sa,
				after: sb,
				text: `${elementName(after.kind, after.label)} resized ${fmt(sa)} → ${fmt(sb)}`
			});
		}
	}

	const gear: ElementEntry[] = [];
	const gearA = new Map((a.gear ?? []).map((g) => [g.id, g]));
	const gearB = new Map((b.gear ?? []).map((g) => [g.id, g]));
	for (const [id, g] of gearB) if (!gearA.has(id)) gear.push({ id, kind: g.kind, label: g.name, text: `Gear “${g.name}” (${g.kind}) taken from the gear shelf` });
	for (const [id, g] of gearA) if (!gearB.has(id)) gear.push({ id, kind: g.kind, label: g.name, text: `Gear “${g.name}” (${g.kind}) no longer used` });

	const settings = settingChanges(a.scene, b.scene);
	const notes = notesChange(a.notes ?? '', b.notes ?? '');
	const exposure = exposureChange(a, b, labelOf);
	const planOnlyChange =
		added.length + removed.length + moved.length + altered.length === 0 && JSON.stringify(a.plan ?? {}) !== JSON.stringify(b.plan ?? {});
	const identical =
		added.length + removed.length + moved.length + altered.length + settings.length + gear.length === 0 &&
		!notes.changed &&
		JSON.stringify(a.scene) === JSON.stringify(b.scene) &&
		JSON.stringify(a.plan ?? {}) === JSON.stringify(b.plan ?? {});
	return { added, removed, moved, altered, settings, notes, gear, exposure, identical, planOnlyChange };
}

function isLight(kind: string): boolean {
	return kind === 'flash' || kind === 'continuous' || kind === 'reflector';
}

/** Every change as one sentence each, in reading order (for a short summary). */
export function comparisonSentences(c: Comparison): string[] {
	const out = [
		...c.added.map((e) => e.text),
		...c.removed.map((e) => e.text),
		...c.moved.map((e) => e.text),
		...c.altered.map((e) => e.text),
		...c.settings.map((e) => e.text),
		...c.gear.map((e) => e.text)
	];
	if (c.planOnlyChange) out.push('The plan drawing changed (colours or other drawing details only)');
	if (c.notes.text) out.push(c.notes.text);
	if (!c.identical || c.exposure.deltaStops) out.push(c.exposure.text);
	return out;
}
