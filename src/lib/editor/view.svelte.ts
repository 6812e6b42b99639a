/**
 * The editor's view of the plan (session state, never saved): zoom and pan, the stage's size, and
 * what follows from them (grid, scale bar). Until the user moves the view it keeps fitting the plan,
 * so a stage that first reports its size shows the whole plan.
 */
import type { UnitSystem } from '$lib/light/format';
import { gridLines, gridSteps, scaleBar } from './grid';
import { boundsOfElements, expandBounds, type Bounds } from './model/geometry';
import type { EditorModel, Vec2 } from './model/types';
import { DEFAULT_VIEWPORT, fitBounds, panBy, screenToPlan, zoomAt, ZOOM_STEP, type Viewport } from './viewport';

export interface StageSize {
	widthPx: number;
	heightPx: number;
}

/** Assumed before the stage reports its size (tests, the server). */
const FALLBACK_STAGE: StageSize = { widthPx: 800, heightPx: 600 };

/** The plan's own frame of the table (the document's `plan.viewport`), if it has one. */
export function planFrame(model: EditorModel): Bounds | null {
	const v = model.kept.rest.viewport as { center?: [number, number]; widthM?: number; depthM?: number } | undefined;
	if (!v?.center || !v.widthM || !v.depthM) return null;
	return { minX: v.center[0] - v.widthM / 2, maxX: v.center[0] + v.widthM / 2, minY: v.center[1] - v.depthM / 2, maxY: v.center[1] + v.depthM / 2 };
}

/**
 * What "fit" shows: the elements (the background left out unless it is all there is) and the plan's
 * own frame of the table, whichever are there.
 */
export function fitTarget(model: EditorModel): Bounds | null {
	const elements = Object.values(model.elements);
	const content = boundsOfElements(elements.filter((e) => e.kind !== 'background')) ?? boundsOfElements(elements);
	const frame = planFrame(model);
	if (!content || !frame) return content ?? frame;
	return {
		minX: Math.min(content.minX, frame.minX),
		minY: Math.min(content.minY, frame.minY),
		maxX: Math.max(content.maxX, frame.maxX),
		maxY: Math.max(content.maxY, frame.maxY)
	};
}

export class EditorView {
	#viewport = $state.raw<Viewport>(DEFAULT_VIEWPORT);
	#stageSize = $state.raw<StageSize | null>(null);
	#fitPending = true;
	readonly #unitSystem: () => UnitSystem;
	readonly #fitTarget: () => Bounds | null;

	/** `fitTarget`: the plan's extent that "fit" shows (see `fitTarget`). */
	constructor(options: { unitSystem: () => UnitSystem; fitTarget: () => Bounds | null }) {
		this.#unitSystem = options.unitSystem;
		this.#fitTarget = options.fitTarget;
	}

	get viewport(): Viewport {
		return this.#viewport;
	}
	get stageSize(): StageSize | null {
		return this.#stageSize;
	}
	readonly gridSteps = $derived.by(() => gridSteps(this.#unitSystem(), this.#viewport.zoom));
	readonly scaleBar = $derived.by(() => scaleBar(this.#unitSystem(), this.#viewport.zoom));
	/** Grid lines in view (plan metres), for the stage. */
	readonly gridLines = $derived.by(() => {
		const size = this.#stageSize ?? FALLBACK_STAGE;
		return gridLines(this.#viewport, size.widthPx, size.heightPx, this.gridSteps);
	});

	/** The plan point at the middle of the stage. */
	get centre(): Vec2 {
		const size = this.#stageSize ?? FALLBACK_STAGE;
		return screenToPlan(this.#viewport, [size.widthPx / 2, size.heightPx / 2]);
	}

	/** The stage was resized: fit the plan if the user has not moved the view yet, else keep the centre. */
	setStageSize(widthPx: number, heightPx: number) {
		if (!(widthPx > 0 && heightPx > 0)) return;
		const old = this.#stageSize;
		if (old && old.widthPx === widthPx && old.heightPx === heightPx) return;
		this.#stageSize = { widthPx, heightPx };
		if (this.#fitPending) this.zoomToFit();
		else if (old) this.#viewport = panBy(this.#viewport, (widthPx - old.widthPx) / 2, (heightPx - old.heightPx) / 2);
	}
	setViewport(viewport: Viewport) {
		this.#viewport = viewport;
		this.#fitPending = false;
	}
	panBy(dxPx: number, dyPx: number) {
		this.setViewport(panBy(this.#viewport, dxPx, dyPx));
	}
	zoomBy(factor: number, aroundScreen?: Vec2) {
		const size = this.#stageSize ?? FALLBACK_STAGE;
		this.setViewport(zoomAt(this.#viewport, aroundScreen ?? [size.widthPx / 2, size.heightPx / 2], factor));
	}
	zoomIn() {
		this.zoomBy(ZOOM_STEP);
	}
	zoomOut() {
		this.zoomBy(1 / ZOOM_STEP);
	}
	/** Shows the whole plan (once the stage has a size). */
	zoomToFit() {
		const size = this.#stageSize;
		if (!size) return;
		const b = this.#fitTarget();
		if (!b) return;
		this.setViewport(fitBounds(expandBounds(b, 0.03), size.widthPx, size.heightPx));
	}
	/** A new plan was loaded: fit it now, or as soon as the stage has a size. */
	refit() {
		this.#fitPending = true;
		this.zoomToFit();
	}
	screenToPlan(screen: Vec2): Vec2 {
		return screenToPlan(this.#viewport, screen);
	}
}
