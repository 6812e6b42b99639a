/**
 * The plan's drawing language in one place: how each element kind is drawn (its symbol, in parts of
 * plain geometry at real size), the two line weights and the four line types, hatching and stipple,
 * and the wedges a flag blocks. Every place that draws a plan (the editor's stage, and through its
 * snapshot the printed sheet, the thumbnail and the PNG) paints these parts with `paintParts` on a
 * canvas. A new element kind is one entry in `SYMBOLS`. The rules are written out in DEVELOPERS.md.
 */
import { emitterParts, cameraParts, PANEL_THICKNESS_M } from './model/geometry';
import { finishOf } from './model/defaults';
import type { EditorElement, ReflectorElement, ReflectorFinish } from './model/schema';
import type { EditorModel, Vec2 } from './model/types';
import { elementsInOrder, subjectOf } from './model/types';
import { beamColours, drawnKelvin, type PlanPalette } from './palette';
import { kelvinToRgb, rgbToHex } from './kelvin-colour';

/** Continuous thick (outlines at real size), continuous thin, dashed thin (above or below the table), long dash-dot thin (axes). */
export type LineType = 'outline' | 'thin' | 'hidden' | 'axis';

/** Screen widths at the reference zoom, 2:1. */
export const LINE_WEIGHT_PX = { thick: 1.6, thin: 0.8 } as const;
/** Zoom (px per metre) at which lines have their listed weight; they scale with zoom within ×0.75 … ×1.5. */
const REFERENCE_ZOOM = 600;
/** Dash patterns in screen pixels. */
export const DASH_PX: Record<LineType, number[]> = { outline: [], thin: [], hidden: [6, 4], axis: [16, 3, 2, 3] };

/** Line weights for a zoom: scaled with it, within limits, so lines never vanish or turn heavy. */
export function lineWeights(zoom: number): { thick: number; thin: number } {
	const k = Math.min(1.5, Math.max(0.75, zoom / REFERENCE_ZOOM));
	return { thick: LINE_WEIGHT_PX.thick * k, thin: LINE_WEIGHT_PX.thin * k };
}

/** Parallel lines clipped to a part: angles in degrees in the element's frame, spacing on screen. */
export interface Hatch {
	anglesDeg: number[];
	spacingPx: number;
}

export type Paint = 'ink' | 'paper' | 'card' | 'subject' | 'caution' | { colour: string; opacity?: number };

export interface SymbolPart {
	/** A polyline or polygon (x, y pairs in metres), a circle, or an ellipse, in the element's frame. */
	shape: { points: number[]; closed: boolean } | { circle: { x: number; y: number; r: number } } | { ellipse: { x: number; y: number; rx: number; ry: number } };
	line?: LineType;
	/** The line's colour when not ink. */
	stroke?: Paint;
	fill?: Paint;
	hatch?: Hatch;
	stipple?: boolean;
	/** Draw filled arrowheads at the last point of a polyline. */
	arrow?: boolean;
}

export interface SymbolContext {
	/** Metres per screen pixel. */
	pxM: number;
	dark: boolean;
}

export type SymbolOf = (el: EditorElement, c: SymbolContext) => SymbolPart[];

const rect = (u0: number, v0: number, u1: number, v1: number) => ({ points: [u0, v0, u1, v0, u1, v1, u0, v1], closed: true });
const segment = (u0: number, v0: number, u1: number, v1: number) => ({ points: [u0, v0, u1, v1], closed: false });

/** A card's surface as drawn: its finish when it is one of the four, else the nearest by surface and reflectance. */
export function reflectorFinish(el: ReflectorElement): ReflectorFinish {
	return finishOf(el) ?? (el.reflectance < 0.15 ? 'black' : el.surface === 'specular' ? 'silver' : 'white');
}

const FINISH_PARTS: Record<ReflectorFinish, Pick<SymbolPart, 'fill' | 'hatch'>> = {
	white: { fill: 'card' },
	silver: { fill: 'card', hatch: { anglesDeg: [45, -45], spacingPx: 4 } },
	gold: { fill: { colour: '#e3b65a', opacity: 0.45 }, hatch: { anglesDeg: [45], spacingPx: 4 } },
	black: { fill: 'ink' }
};

/** A field read defensively: a size the model may not have yet on every element. */
function sizeField(el: EditorElement, keys: string[], fallback: number): number {
	const fields = el as unknown as Record<string, unknown>;
	for (const k of keys) if (typeof fields[k] === 'number' && (fields[k] as number) > 0) return fields[k] as number;
	return fallback;
}

/** A panel's bar at its real width and a thickness a few pixels at least, facing +u. */
function bar(el: EditorElement, c: SymbolContext, thicknessM: number) {
	const t = Math.max(thicknessM, 4 * c.pxM) / 2;
	const half = sizeField(el, ['widthM'], 0.3) / 2;
	return { t, half };
}

function emitter(el: EditorElement, c: SymbolContext): SymbolPart[] {
	if (el.kind !== 'flash' && el.kind !== 'continuous') return [];
	const p = emitterParts(el);
	const colour = rgbToHex(kelvinToRgb(drawnKelvin(el)));
	const r = p.headWidthM / 2;
	const cu = -(p.modifierDepthM + p.headDepthM / 2);
	const parts: SymbolPart[] = [{ shape: { circle: { x: cu, y: 0, r } }, line: 'outline', fill: { colour } }];
	// A continuous light runs hot: a second ring, in the caution colour when it is marked as running hot.
	if (el.kind === 'continuous') parts.push({ shape: { circle: { x: cu, y: 0, r: r + 3 * c.pxM } }, line: 'outline', stroke: el.runsHot ? 'caution' : 'ink' });
	const half = p.faceWidthM / 2;
	if (el.modifier) {
		// The modifier: its sides from the head to the front, the front face thick at its real width.
		parts.push({ shape: { points: [cu, -r, 0, -half, 0, half, cu, r], closed: false }, line: 'thin' });
		if (/grid|honeycomb/i.test(el.modifier.name)) {
			const ticks: number[] = [];
			for (let v = -half; v <= half + 1e-9; v += Math.max(4 * c.pxM, half / 8)) ticks.push(0, v, -4 * c.pxM, v);
			for (let i = 0; i < ticks.length; i += 4) parts.push({ shape: segment(ticks[i], ticks[i + 1], ticks[i + 2], ticks[i + 3]), line: 'thin' });
		}
	}
	// The front face: ink for a modifier's face, the light's own colour for a bare head.
	parts.push({ shape: segment(0, -half, 0, half), line: 'outline', stroke: el.modifier ? 'ink' : { colour: beamColours(drawnKelvin(el), c.dark).stroke } });
	return parts;
}

/**
 * Every element kind's symbol, in its own frame (u along its facing, v across), in metres.
 * A kind missing here is drawn by `fallbackSymbol`: its footprint's outline.
 */
export const SYMBOLS: Record<string, SymbolOf> = {
	subject(el, c) {
		if (el.kind !== 'subject') return [];
		const d = el.depthM / 2;
		const w = el.widthM / 2;
		const arm = 7 * c.pxM;
		const reach = Math.max(d + 10 * c.pxM, 18 * c.pxM);
		return [
			el.living ? { shape: { ellipse: { x: 0, y: 0, rx: d, ry: w } }, line: 'outline', fill: 'subject' } : { shape: rect(-d, -w, d, w), line: 'outline', fill: 'subject' },
			{ shape: segment(-arm, 0, arm, 0), line: 'thin' },
			{ shape: segment(0, -arm, 0, arm), line: 'thin' },
			// Its facing: a short arrow from the centre.
			{ shape: segment(0, 0, reach, 0), line: 'thin', arrow: true }
		];
	},
	camera(el, c) {
		if (el.kind !== 'camera') return [];
		const p = cameraParts(el.focalLengthMm);
		return [
			// The body only as a thin outline behind the lens; the entrance pupil a thick line across the axis.
			{ shape: rect(-(p.lensLengthM + p.bodyDepthM), -p.bodyWidthM / 2, -p.lensLengthM, p.bodyWidthM / 2), line: 'thin' },
			{ shape: rect(-p.lensLengthM, -p.lensWidthM / 2, 0, p.lensWidthM / 2), line: 'thin' },
			{ shape: segment(0, -p.lensWidthM / 2 - 2 * c.pxM, 0, p.lensWidthM / 2 + 2 * c.pxM), line: 'outline' }
		];
	},
	flash: emitter,
	continuous: emitter,
	reflector(el, c) {
		if (el.kind !== 'reflector') return [];
		const { t, half } = bar(el, c, PANEL_THICKNESS_M.reflector);
		return [
			{ shape: rect(-t, -half, t, half), line: 'thin', ...FINISH_PARTS[reflectorFinish(el)] },
			// The reflecting face (+u) thick.
			{ shape: segment(t, -half, t, half), line: 'outline' }
		];
	},
	diffuser(el, c) {
		const { t, half } = bar(el, c, PANEL_THICKNESS_M.diffuser);
		return [{ shape: rect(-t, -half, t, half), line: 'hidden', stroke: 'ink', fill: 'paper', stipple: true }];
	},
	flag(el, c) {
		const { t, half } = bar(el, c, PANEL_THICKNESS_M.flag);
		return [{ shape: rect(-t, -half, t, half), line: 'outline', fill: 'ink' }];
	},
	background(el) {
		const d = sizeField(el, ['depthM'], 0.3) / 2;
		const w = sizeField(el, ['widthM'], 0.5) / 2;
		const colour = (el as { colour?: string }).colour ?? '#808080';
		return [{ shape: rect(-d, -w, d, w), line: 'thin', stroke: 'ink', fill: { colour, opacity: 0.25 } }];
	},
	/** A window or open sky placed on the plan: the opening thick with a broad arrow for the light's direction. */
	ambient(el, c) {
		const half = sizeField(el, ['widthM'], 0.6) / 2;
		const len = Math.max(0.08, 40 * c.pxM);
		const head = Math.min(half, 12 * c.pxM);
		return [
			{ shape: segment(0, -half, 0, half), line: 'outline' },
			{ shape: { points: [0, -head / 2, len - head, -head / 2, len - head, -head, len, 0, len - head, head, len - head, head / 2, 0, head / 2], closed: true }, line: 'thin', fill: { colour: '#d8e6f3', opacity: 0.8 } }
		];
	}
};

export function fallbackSymbol(el: EditorElement): SymbolPart[] {
	const half = sizeField(el, ['widthM'], 0.1) / 2;
	const d = sizeField(el, ['depthM'], 0.02) / 2;
	return [{ shape: rect(-d, -half, d, half), line: 'outline' }];
}

/** An element's symbol; a locked element also gets a small closed square at its back corner. */
export function symbolParts(el: EditorElement, c: SymbolContext): SymbolPart[] {
	const parts = (SYMBOLS[el.kind] ?? fallbackSymbol)(el, c);
	if (!el.locked || !parts.length) return parts;
	let u0 = Infinity, v0 = Infinity;
	for (const p of parts) {
		const [x0, y0] = partBounds(p.shape);
		u0 = Math.min(u0, x0);
		v0 = Math.min(v0, y0);
	}
	const s = 6 * c.pxM;
	return [...parts, { shape: rect(u0 - 3 * c.pxM - s, v0 - 3 * c.pxM - s, u0 - 3 * c.pxM, v0 - 3 * c.pxM), fill: 'ink' }];
}

// ---------- what a flag blocks ----------

/** Where two plan segments cross (both ends excluded), as the parameter along the first; null if they do not. */
function crossing(a: Vec2, b: Vec2, c: Vec2, d: Vec2): number | null {
	const r = [b[0] - a[0], b[1] - a[1]];
	const s = [d[0] - c[0], d[1] - c[1]];
	const den = r[0] * s[1] - r[1] * s[0];
	if (Math.abs(den) < 1e-12) return null;
	const t = ((c[0] - a[0]) * s[1] - (c[1] - a[1]) * s[0]) / den;
	const u = ((c[0] - a[0]) * r[1] - (c[1] - a[1]) * r[0]) / den;
	return t > 0 && t < 1 && u >= 0 && u <= 1 ? t : null;
}

export interface FlagShadow {
	id: string;
	flagId: string;
	lightId: string;
	/** Plan x, y pairs: the flag's two ends, then the far ends of the shadow, past the subject. */
	points: number[];
}

/**
 * For each flag and each light whose straight line to the subject it crosses (the engine's test for a
 * blocked light), the wedge of the plan in its shadow, on the subject's side, to a little past the subject.
 */
export function flagShadows(model: EditorModel): FlagShadow[] {
	const subject = subjectOf(model);
	if (!subject) return [];
	const s: Vec2 = [subject.xM, subject.yM];
	const elements = elementsInOrder(model);
	const out: FlagShadow[] = [];
	for (const flag of elements) {
		if (flag.kind !== 'flag') continue;
		const [a, b] = panelEnds(flag);
		for (const light of elements) {
			if (light.kind !== 'flash' && light.kind !== 'continuous') continue;
			const l: Vec2 = [light.xM, light.yM];
			if (crossing(l, s, a, b) === null) continue;
			const reach = 1.2 * Math.hypot(s[0] - l[0], s[1] - l[1]);
			const far = (p: Vec2) => {
				const len = Math.hypot(p[0] - l[0], p[1] - l[1]) || 1;
				return [l[0] + ((p[0] - l[0]) / len) * reach, l[1] + ((p[1] - l[1]) / len) * reach];
			};
			out.push({ id: `${flag.id}:${light.id}`, flagId: flag.id, lightId: light.id, points: [...a, ...b, ...far(b), ...far(a)] });
		}
	}
	return out;
}

function panelEnds(el: EditorElement): [Vec2, Vec2] {
	const rad = (el.rotationDeg * Math.PI) / 180;
	const half = sizeField(el, ['widthM'], 0.3) / 2;
	const vx = -Math.sin(rad) * half;
	const vy = Math.cos(rad) * half;
	return [
		[el.xM + vx, el.yM + vy],
		[el.xM - vx, el.yM - vy]
	];
}

// ---------- painting ----------

/** The colours a part's paint stands for, from the plan's palette. */
export function paintColour(p: Paint, palette: PlanPalette): { colour: string; opacity: number } {
	if (p === 'ink') return { colour: palette.ink, opacity: 1 };
	if (p === 'paper') return { colour: palette.paper, opacity: 1 };
	if (p === 'card') return { colour: palette.cardFill, opacity: 1 };
	if (p === 'caution') return { colour: palette.caution, opacity: 1 };
	if (p === 'subject') return { colour: palette.subjectFill, opacity: 1 };
	return { colour: p.colour, opacity: p.opacity ?? 1 };
}

function tracePath(ctx: CanvasRenderingContext2D, shape: SymbolPart['shape']) {
	ctx.beginPath();
	if ('circle' in shape) ctx.arc(shape.circle.x, shape.circle.y, shape.circle.r, 0, 2 * Math.PI);
	else if ('ellipse' in shape) ctx.ellipse(shape.ellipse.x, shape.ellipse.y, shape.ellipse.rx, shape.ellipse.ry, 0, 0, 2 * Math.PI);
	else {
		const p = shape.points;
		ctx.moveTo(p[0], p[1]);
		for (let i = 2; i < p.length; i += 2) ctx.lineTo(p[i], p[i + 1]);
		if (shape.closed) ctx.closePath();
	}
}

function partBounds(shape: SymbolPart['shape']): [number, number, number, number] {
	if ('circle' in shape) return [shape.circle.x - shape.circle.r, shape.circle.y - shape.circle.r, shape.circle.x + shape.circle.r, shape.circle.y + shape.circle.r];
	if ('ellipse' in shape) return [shape.ellipse.x - shape.ellipse.rx, shape.ellipse.y - shape.ellipse.ry, shape.ellipse.x + shape.ellipse.rx, shape.ellipse.y + shape.ellipse.ry];
	let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
	for (let i = 0; i < shape.points.length; i += 2) {
		x0 = Math.min(x0, shape.points[i]);
		x1 = Math.max(x1, shape.points[i]);
		y0 = Math.min(y0, shape.points[i + 1]);
		y1 = Math.max(y1, shape.points[i + 1]);
	}
	return [x0, y0, x1, y1];
}

/**
 * Paints parts on a canvas whose transform is the element's frame in metres (`zoom` px per metre):
 * fill, then hatching or stipple clipped to the part, then its line with the weight and dash of its type.
 */
export function paintParts(ctx: CanvasRenderingContext2D, parts: readonly SymbolPart[], zoom: number, palette: PlanPalette) {
	const pxM = 1 / zoom;
	const weights = lineWeights(zoom);
	for (const part of parts) {
		tracePath(ctx, part.shape);
		if (part.fill) {
			const { colour, opacity } = paintColour(part.fill, palette);
			ctx.globalAlpha = opacity;
			ctx.fillStyle = colour;
			ctx.fill();
			ctx.globalAlpha = 1;
		}
		if (part.hatch || part.stipple) {
			const [x0, y0, x1, y1] = partBounds(part.shape);
			ctx.save();
			ctx.clip();
			ctx.strokeStyle = palette.ink;
			ctx.fillStyle = palette.inkSoft;
			ctx.lineWidth = weights.thin * pxM;
			const reach = Math.hypot(x1 - x0, y1 - y0);
			const cx = (x0 + x1) / 2;
			const cy = (y0 + y1) / 2;
			if (part.hatch) {
				const step = part.hatch.spacingPx * pxM;
				ctx.beginPath();
				for (const deg of part.hatch.anglesDeg) {
					const a = (deg * Math.PI) / 180;
					const [dx, dy] = [Math.cos(a), Math.sin(a)];
					for (let k = -reach; k <= reach; k += step) {
						const ox = cx - dy * k;
						const oy = cy + dx * k;
						ctx.moveTo(ox - dx * reach, oy - dy * reach);
						ctx.lineTo(ox + dx * reach, oy + dy * reach);
					}
				}
				ctx.stroke();
			}
			if (part.stipple) {
				const step = 4 * pxM;
				const dot = 0.6 * pxM;
				for (let x = x0 + step / 2; x < x1; x += step) for (let y = y0 + step / 2; y < y1; y += step) ctx.fillRect(x - dot / 2, y - dot / 2, dot, dot);
			}
			ctx.restore();
			tracePath(ctx, part.shape);
		}
		if (part.line) {
			ctx.strokeStyle = part.stroke ? paintColour(part.stroke, palette).colour : palette.ink;
			ctx.lineWidth = (part.line === 'outline' ? weights.thick : weights.thin) * pxM;
			ctx.setLineDash(DASH_PX[part.line].map((d) => d * pxM));
			ctx.lineCap = 'butt';
			ctx.stroke();
			ctx.setLineDash([]);
		}
		if (part.arrow && 'points' in part.shape) arrowHead(ctx, part.shape.points, 7 * pxM, ctx.strokeStyle as string);
	}
}

/** A filled arrowhead at the end of a polyline. */
export function arrowHead(ctx: CanvasRenderingContext2D, points: readonly number[], sizeM: number, colour: string) {
	const n = points.length;
	const [x1, y1, x2, y2] = [points[n - 4], points[n - 3], points[n - 2], points[n - 1]];
	const len = Math.hypot(x2 - x1, y2 - y1) || 1;
	const ux = (x2 - x1) / len;
	const uy = (y2 - y1) / len;
	ctx.beginPath();
	ctx.moveTo(x2, y2);
	ctx.lineTo(x2 - ux * sizeM - uy * sizeM * 0.35, y2 - uy * sizeM + ux * sizeM * 0.35);
	ctx.lineTo(x2 - ux * sizeM + uy * sizeM * 0.35, y2 - uy * sizeM - ux * sizeM * 0.35);
	ctx.closePath();
	ctx.fillStyle = colour;
	ctx.fill();
}

/** A flag's shadow: a plan polygon hatched with thin lines, its edges thin, painted in plan metres. */
export function paintShadow(ctx: CanvasRenderingContext2D, points: readonly number[], zoom: number, palette: PlanPalette) {
	paintParts(ctx, [{ shape: { points: [...points], closed: true }, hatch: { anglesDeg: [-45], spacingPx: 7 }, line: 'thin', stroke: { colour: palette.inkSoft } }], zoom, palette);
}
