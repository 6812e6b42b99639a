/**
 * The view of the plan: a zoom in screen pixels per metre and a pan (where the plan's origin lands
 * on screen). Session state, never saved.
 */
import type { Bounds } from './model/geometry';
import type { Vec2 } from './model/types';

export interface Viewport {
	/** Screen pixels per metre of table. */
	zoom: number;
	/** Screen position of the plan's origin, in pixels. */
	panX: number;
	panY: number;
}

/** 25 m to 2.5 cm across a 1000-pixel stage: a room to a single small specimen. */
export const MIN_ZOOM = 40;
export const MAX_ZOOM = 40_000;
export const ZOOM_STEP = 1.25;

export const DEFAULT_VIEWPORT: Viewport = { zoom: 1000, panX: 400, panY: 300 };

export function clampZoom(zoom: number): number {
	return Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, zoom));
}

export function planToScreen(v: Viewport, p: Vec2): Vec2 {
	return [p[0] * v.zoom + v.panX, p[1] * v.zoom + v.panY];
}

export function screenToPlan(v: Viewport, s: Vec2): Vec2 {
	return [(s[0] - v.panX) / v.zoom, (s[1] - v.panY) / v.zoom];
}

/** Zoom by a factor keeping the plan point under `screen` where it is. */
export function zoomAt(v: Viewport, screen: Vec2, factor: number): Viewport {
	const zoom = clampZoom(v.zoom * factor);
	const p = screenToPlan(v, screen);
	return { zoom, panX: screen[0] - p[0] * zoom, panY: screen[1] - p[1] * zoom };
}

export function panBy(v: Viewport, dxPx: number, dyPx: number): Viewport {
	return { ...v, panX: v.panX + dxPx, panY: v.panY + dyPx };
}

/** The plan area visible in a stage of the given size. */
export function visibleBounds(v: Viewport, widthPx: number, heightPx: number): Bounds {
	const [minX, minY] = screenToPlan(v, [0, 0]);
	const [maxX, maxY] = screenToPlan(v, [widthPx, heightPx]);
	return { minX, minY, maxX, maxY };
}

/** A view that shows the bounds whole, centred, with a margin. */
export function fitBounds(b: Bounds, widthPx: number, heightPx: number, paddingPx = 48): Viewport {
	const w = Math.max(b.maxX - b.minX, 0.05);
	const h = Math.max(b.maxY - b.minY, 0.05);
	const zoom = clampZoom(Math.min((widthPx - 2 * paddingPx) / w, (heightPx - 2 * paddingPx) / h));
	const cx = (b.minX + b.maxX) / 2;
	const cy = (b.minY + b.maxY) / 2;
	return { zoom, panX: widthPx / 2 - cx * zoom, panY: heightPx / 2 - cy * zoom };
}

/** How far an element may come to the stage's edge before the view follows it, in pixels. */
const KEEP_IN_VIEW_MARGIN_PX = 32;

/**
 * The pan (in screen pixels) that brings bounds back into view with a margin, or null when they are
 * in view: the view follows an element dragged, nudged or placed past the stage's edge. Bounds larger
 * than the view show their left and top edges.
 */
export function keepInViewDelta(v: Viewport, widthPx: number, heightPx: number, b: Bounds): [number, number] | null {
	const m = KEEP_IN_VIEW_MARGIN_PX;
	const axis = (lo: number, hi: number, pan: number, size: number) => {
		const a = lo * v.zoom + pan;
		const z = hi * v.zoom + pan;
		if (a < m) return m - a;
		if (z > size - m) return Math.max(size - m - z, m - a);
		return 0;
	};
	const dx = axis(b.minX, b.maxX, v.panX, widthPx);
	const dy = axis(b.minY, b.maxY, v.panY, heightPx);
	return dx || dy ? [dx, dy] : null;
}
