/**
 * Where the plan's words go: each dimension line's text and each element's label, placed so that none
 * overlaps another or an element's outline. Dimension texts slide along their line; a label tries a few
 * positions around its element (below, above, beside, the corners, then farther out) and keeps the first
 * free one, joined to the element by a thin leader ending in a dot. Worked out in screen pixels at the
 * plan's zoom (words keep their size on screen), from plain data, so it is tested without a browser.
 */
import { elementBounds, type Bounds } from './model/geometry';
import type { DimensionLine } from './model/dimensions';
import type { EditorElement } from './model/schema';
import type { Vec2 } from './model/types';

export const LABEL_FONT_PX = 11;
export const DIMENSION_FONT_PX = 11;
export const HEIGHT_FONT_PX = 9;
/** How far a dimension line stands off the line it measures, on screen. */
export const DIMENSION_OFFSET_PX = 16;

/** A box in screen pixels relative to the plan's origin (plan metres × zoom). */
export interface Box {
	x0: number;
	y0: number;
	x1: number;
	y1: number;
}

export const overlaps = (a: Box, b: Box, pad = 0) => a.x0 < b.x1 + pad && b.x0 < a.x1 + pad && a.y0 < b.y1 + pad && b.y0 < a.y1 + pad;

/** A generous width for a line of Work Sans (its average advance is about 0.55 em). */
export function textWidthPx(text: string, fontPx: number): number {
	return Math.ceil(text.length * fontPx * 0.6) + 2;
}

export interface DimensionDrawing {
	id: string;
	/** The dimension line's ends (plan metres), offset beside the measured line. */
	a: Vec2;
	b: Vec2;
	/** Extension lines (plan metres): from just short of each end of the measured line to a little past the dimension line. */
	ext1: [number, number, number, number];
	ext2: [number, number, number, number];
	/** Unit vector along the line, for the arrowheads. */
	along: Vec2;
	/** The text's centre (plan metres) and rotation (degrees, kept readable). */
	textAt: Vec2;
	/** When the words sit beyond an end (a short dimension), the dimension line runs on under them to here. */
	runOut: Vec2 | null;
	angleDeg: number;
	label: string;
	heightLabel: string | null;
	box: Box;
}

export interface PlacedLabel {
	id: string;
	text: string;
	box: Box;
	/** Where the leader starts on the element (plan metres) and where it meets the label. */
	anchor: Vec2;
	leaderEnd: Vec2;
}

/** What else may carry a label: e.g. the camera's field at the plane of focus. */
export interface ExtraLabel {
	id: string;
	text: string;
	anchor: Vec2;
}

const ALONG = [0.5, 0.4, 0.6, 0.3, 0.7, 0.2, 0.8];

/** Where a dimension's words may go, in order: along the line, then beyond either end (a short dimension). */
function dimensionPositions(line: DimensionLine, zoom: number): number[] {
	const lenPx = Math.hypot(line.to[0] - line.from[0], line.to[1] - line.from[1]) * zoom || 1;
	const out = textWidthPx(line.label, DIMENSION_FONT_PX) / 2 + 10;
	const beyond = [1, 2, 3, 4].flatMap((k) => [-(k * out) / lenPx, 1 + (k * out) / lenPx]);
	return [...ALONG, ...beyond];
}

/**
 * A dimension line drawn with its words at `t` along it (beyond an end when t is outside 0…1) and on
 * `side` of the measured line (1: to the left of its direction, −1: to the right): its geometry, and
 * the box its words take.
 */
export function dimensionDrawing(line: DimensionLine, zoom: number, t = 0.5, side: 1 | -1 = 1): DimensionDrawing | null {
	const [x1, y1] = line.from;
	const [x2, y2] = line.to;
	const len = Math.hypot(x2 - x1, y2 - y1);
	if (len * zoom < 24) return null; // too short to mark on screen
	const ux = (x2 - x1) / len;
	const uy = (y2 - y1) / len;
	// Offset to the left of the direction of travel, a fixed distance on screen.
	const nx = -uy * side;
	const ny = ux * side;
	const off = DIMENSION_OFFSET_PX / zoom;
	const gap = 3 / zoom;
	const past = 4 / zoom;
	let angleDeg = (Math.atan2(uy, ux) * 180) / Math.PI;
	if (angleDeg > 90) angleDeg -= 180;
	else if (angleDeg <= -90) angleDeg += 180;
	const w = Math.max(textWidthPx(line.label, DIMENSION_FONT_PX), line.heightLabel ? textWidthPx(line.heightLabel, HEIGHT_FONT_PX) : 0);
	const h = line.heightLabel ? 24 : 13;
	// The words sit on the far side of the dimension line from the measured line ("above" it).
	const textOff = off + (h / 2 + 2) / zoom;
	const textAt: Vec2 = [x1 + (x2 - x1) * t + nx * textOff, y1 + (y2 - y1) * t + ny * textOff];
	const rad = (angleDeg * Math.PI) / 180;
	const halfW = (Math.abs(Math.cos(rad)) * w + Math.abs(Math.sin(rad)) * h) / 2;
	const halfH = (Math.abs(Math.sin(rad)) * w + Math.abs(Math.cos(rad)) * h) / 2;
	const cx = textAt[0] * zoom;
	const cy = textAt[1] * zoom;
	return {
		id: line.id,
		a: [x1 + nx * off, y1 + ny * off],
		b: [x2 + nx * off, y2 + ny * off],
		ext1: [x1 + nx * gap, y1 + ny * gap, x1 + nx * (off + past), y1 + ny * (off + past)],
		ext2: [x2 + nx * gap, y2 + ny * gap, x2 + nx * (off + past), y2 + ny * (off + past)],
		along: [ux, uy],
		textAt,
		runOut: t < 0 || t > 1 ? [x1 + (x2 - x1) * t + nx * off, y1 + (y2 - y1) * t + ny * off] : null,
		angleDeg,
		label: line.label,
		heightLabel: line.heightLabel,
		box: { x0: cx - halfW, y0: cy - halfH, x1: cx + halfW, y1: cy + halfH }
	};
}

/** An element's outline as a box on screen; a kind the geometry does not know is a small box round its position. */
export function elementBox(el: EditorElement, zoom: number): Box {
	let b: Bounds;
	try {
		b = elementBounds(el);
	} catch {
		b = { minX: el.xM - 0.02, maxX: el.xM + 0.02, minY: el.yM - 0.02, maxY: el.yM + 0.02 };
	}
	return { x0: b.minX * zoom, y0: b.minY * zoom, x1: b.maxX * zoom, y1: b.maxY * zoom };
}

/** Directions tried around an element, in order: below, above, right, left, then the corners. */
const DIRECTIONS: Vec2[] = [
	[0, 1],
	[0, -1],
	[1, 0],
	[-1, 0],
	[1, 1],
	[-1, 1],
	[1, -1],
	[-1, -1]
];
const GAPS_PX = [6, 20, 40, 64, 96];
const LABEL_HEIGHT_PX = 14;

function candidateBox(around: Box, dir: Vec2, gap: number, w: number): Box {
	const h = LABEL_HEIGHT_PX;
	const cx = (around.x0 + around.x1) / 2;
	const cy = (around.y0 + around.y1) / 2;
	const x0 = dir[0] > 0 ? around.x1 + gap : dir[0] < 0 ? around.x0 - gap - w : cx - w / 2;
	const y0 = dir[1] > 0 ? around.y1 + gap : dir[1] < 0 ? around.y0 - gap - h : cy - h / 2;
	return { x0, y0, x1: x0 + w, y1: y0 + h };
}

function nearestOnBox(b: Box, p: Vec2): Vec2 {
	return [Math.min(Math.max(p[0], b.x0), b.x1), Math.min(Math.max(p[1], b.y0), b.y1)];
}

interface LabelItem {
	id: string;
	text: string;
	around: Box;
	anchorPx: Vec2;
}

export interface AnnotationInput {
	elements: readonly EditorElement[];
	dimensions: readonly DimensionLine[];
	extras?: readonly ExtraLabel[];
	zoom: number;
	/** What is being edited: placed after the rest, so the rest stays put while it moves. */
	liveIds?: ReadonlySet<string>;
	/** The part of the plan on screen (plan metres × zoom): words are kept inside it where they can be. */
	frame?: Box;
}

export interface Annotations {
	dimensions: DimensionDrawing[];
	labels: PlacedLabel[];
}

/**
 * Places every dimension text and label. The words of what is not being edited are placed first
 * against what is not being edited; then the words of the live part against everything, so a drag
 * moves only its own words.
 */
export function placeAnnotations(input: AnnotationInput): Annotations {
	return new AnnotationPlacer().place(input);
}

/**
 * `placeAnnotations` that remembers its last placement of what is not being edited: while only the
 * live part changes (a drag), that half is reused as it was (same objects, so nothing redraws it) and
 * only the live words are placed again.
 */
export class AnnotationPlacer {
	#staticKey: unknown[] = [];
	#static: { result: Annotations; taken: Box[] } | null = null;

	place(input: AnnotationInput): Annotations {
		const { elements, dimensions, extras = [], zoom, liveIds = new Set(), frame } = input;
		const drawn = elements.filter((e) => e.kind !== 'background');
		const still = drawn.filter((e) => !liveIds.has(e.id));
		const stillDims = dimensions.filter((d) => !liveIds.has(d.id));
		const stillExtras = extras.filter((x) => !liveIds.has(x.id));
		const key = [zoom, frame?.x0, frame?.y0, frame?.x1, frame?.y1, JSON.stringify(stillExtras), ...still, '|', ...stillDims];
		if (!this.#static || key.length !== this.#staticKey.length || key.some((k, i) => k !== this.#staticKey[i])) {
			const taken: Box[] = [];
			const result = placePass(still, still, stillDims, stillExtras, zoom, frame, taken);
			this.#static = { result, taken };
			this.#staticKey = key;
		}
		const taken = [...this.#static.taken];
		const live = placePass(
			drawn,
			drawn.filter((e) => liveIds.has(e.id)),
			dimensions.filter((d) => liveIds.has(d.id)),
			extras.filter((x) => liveIds.has(x.id)),
			zoom,
			frame,
			taken
		);
		return { dimensions: [...this.#static.result.dimensions, ...live.dimensions], labels: [...this.#static.result.labels, ...live.labels] };
	}
}

/**
 * One pass: places the words of `own` (and of `dimensions`, `extras`) clear of `taken` (which it
 * extends) and of the outlines of `obstacles`, inside `frame` where it can, else anywhere free.
 */
function placePass(
	obstacles: readonly EditorElement[],
	own: readonly EditorElement[],
	dimensions: readonly DimensionLine[],
	extras: readonly ExtraLabel[],
	zoom: number,
	frame: Box | undefined,
	taken: Box[]
): Annotations {
	const outlines = obstacles.map((e) => elementBox(e, zoom));
	const clear = (b: Box) => !outlines.some((o) => overlaps(b, o, 1)) && !taken.some((o) => overlaps(b, o, 1));
	const inside = (b: Box) => !frame || (b.x0 >= frame.x0 && b.x1 <= frame.x1 && b.y0 >= frame.y0 && b.y1 <= frame.y1);
	/** The first candidate clear and on the stage, else the first clear one, else the first. */
	function pick<T>(candidates: T[], boxOf: (c: T) => Box): T {
		return candidates.find((c) => clear(boxOf(c)) && inside(boxOf(c))) ?? candidates.find((c) => clear(boxOf(c))) ?? candidates[0];
	}
	const out: Annotations = { dimensions: [], labels: [] };
	for (const line of dimensions) {
		const candidates: DimensionDrawing[] = [];
		for (const t of dimensionPositions(line, zoom)) {
			for (const side of [1, -1] as const) {
				const d = dimensionDrawing(line, zoom, t, side);
				if (d) candidates.push(d);
			}
		}
		if (!candidates.length) continue;
		const chosen = pick(candidates, (d) => d.box);
		out.dimensions.push(chosen);
		taken.push(chosen.box);
	}
	const items: LabelItem[] = [];
	for (const el of own) {
		if (el.kind === 'background' || !el.label) continue;
		items.push({ id: el.id, text: el.label, around: elementBox(el, zoom), anchorPx: [el.xM * zoom, el.yM * zoom] });
	}
	for (const x of extras) {
		const p: Vec2 = [x.anchor[0] * zoom, x.anchor[1] * zoom];
		items.push({ id: x.id, text: x.text, around: { x0: p[0] - 2, y0: p[1] - 2, x1: p[0] + 2, y1: p[1] + 2 }, anchorPx: p });
	}
	for (const item of items) {
		const w = textWidthPx(item.text, LABEL_FONT_PX);
		const candidates = GAPS_PX.flatMap((gap) => DIRECTIONS.map((dir) => candidateBox(item.around, dir, gap, w)));
		const chosen = pick(candidates, (b) => b);
		taken.push(chosen);
		const end = nearestOnBox(chosen, item.anchorPx);
		out.labels.push({ id: item.id, text: item.text, box: chosen, anchor: [item.anchorPx[0] / zoom, item.anchorPx[1] / zoom], leaderEnd: [end[0] / zoom, end[1] / zoom] });
	}
	return out;
}

/** Every pair of words that overlap, and every label over an element's outline (for tests and checks). */
export function annotationClashes(a: Annotations, elements: readonly EditorElement[], zoom: number): string[] {
	const words = [...a.dimensions.map((d) => ({ id: `dimension ${d.id}`, box: d.box })), ...a.labels.map((l) => ({ id: `label ${l.id}`, box: l.box }))];
	const clashes: string[] = [];
	for (let i = 0; i < words.length; i++) for (let j = i + 1; j < words.length; j++) if (overlaps(words[i].box, words[j].box)) clashes.push(`${words[i].id} over ${words[j].id}`);
	for (const w of words) {
		for (const el of elements) if (el.kind !== 'background' && overlaps(w.box, elementBox(el, zoom))) clashes.push(`${w.id} over element ${el.id}`);
	}
	return clashes;
}
