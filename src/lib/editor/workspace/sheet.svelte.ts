/**
 * The inspector as a sheet at phone width: it rests at one of three stops (collapsed to its handle and
 * tab bar, half the window, nearly all of it), moves between them by a tap or a key on its handle, and
 * follows the handle while it is dragged, coming to rest at the nearest stop when let go.
 */
export type SheetStop = 'collapsed' | 'half' | 'full';

/** Each stop's height in CSS pixels (without the safe-area inset under the sheet). */
export type SheetHeights = Record<SheetStop, number>;

const STOPS: SheetStop[] = ['collapsed', 'half', 'full'];
/** A press that moves less than this is a tap on the handle, not a drag. */
const DRAG_THRESHOLD_PX = 6;

/** The stops' heights in a window `windowPx` tall, for a sheet whose handle and tabs take `collapsedPx`. */
export function sheetHeights(windowPx: number, collapsedPx: number): SheetHeights {
	const full = Math.max(collapsedPx, Math.round(windowPx * 0.88));
	return { collapsed: collapsedPx, half: Math.min(full, Math.max(collapsedPx, Math.round(windowPx * 0.5))), full };
}

/** The stop whose height is nearest to `heightPx`. */
export function nearestStop(heightPx: number, heights: SheetHeights): SheetStop {
	return STOPS.reduce((best, stop) => (Math.abs(heights[stop] - heightPx) < Math.abs(heights[best] - heightPx) ? stop : best));
}

export class InspectorSheet {
	stop = $state<SheetStop>('collapsed');
	/** The height while the handle is dragged (else null: the stop's own height). */
	dragHeightPx = $state<number | null>(null);
	#press: { pointerId: number; y: number; heightPx: number } | null = null;
	#dragged = false;

	get expanded(): boolean {
		return this.stop !== 'collapsed' || this.dragHeightPx !== null;
	}

	/** Opens the sheet to half height if it is collapsed (a larger stop is kept). */
	open() {
		if (this.stop === 'collapsed') this.stop = 'half';
	}

	collapse() {
		this.stop = 'collapsed';
	}

	/** A tap or Enter on the handle: collapsed opens to half, open collapses. */
	toggle() {
		this.stop = this.stop === 'collapsed' ? 'half' : 'collapsed';
	}

	/** One stop up (`+1`) or down (`-1`), as the arrow keys on the handle do. */
	step(direction: 1 | -1) {
		const i = STOPS.indexOf(this.stop) + direction;
		this.stop = STOPS[Math.min(STOPS.length - 1, Math.max(0, i))];
	}

	/** The handle is pressed at `y` (client pixels) while the sheet is `heightPx` tall. */
	press(pointerId: number, y: number, heightPx: number) {
		this.#press = { pointerId, y, heightPx };
		this.#dragged = false;
	}

	move(pointerId: number, y: number, heights: SheetHeights) {
		const p = this.#press;
		if (!p || p.pointerId !== pointerId) return;
		if (!this.#dragged && Math.abs(y - p.y) < DRAG_THRESHOLD_PX) return;
		this.#dragged = true;
		this.dragHeightPx = Math.min(heights.full, Math.max(heights.collapsed, p.heightPx + p.y - y));
	}

	/** The handle is let go (or the pointer is lost): a drag comes to rest at the nearest stop. */
	release(pointerId: number, heights: SheetHeights) {
		if (!this.#press || this.#press.pointerId !== pointerId) return;
		this.#press = null;
		if (this.#dragged && this.dragHeightPx !== null) this.stop = nearestStop(this.dragHeightPx, heights);
		this.dragHeightPx = null;
	}

	/** Takes a click that ends a drag (true), so it does not also toggle the sheet. */
	takeDragClick(): boolean {
		const dragged = this.#dragged;
		this.#dragged = false;
		return dragged;
	}
}
