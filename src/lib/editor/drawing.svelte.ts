/**
 * What the stage draws besides the elements, worked out from the model: dimension lines, beams, bounce
 * paths, and the falloff map. An entry that has not changed keeps its object, so the stage leaves its
 * drawing alone while something else is dragged.
 */
import type { UnitSystem } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import { falloffGrid, type FalloffGrid } from './falloff';
import { FalloffService } from './falloff-service.svelte';
import { dimensionLines, type DimensionLine } from './model/dimensions';
import { boundsOfElements, expandBounds, type Bounds } from './model/geometry';
import { beams, bouncePaths, keepUnchanged, type Beam, type BouncePath } from './model/light-paths';
import type { EditorModel } from './model/types';

export interface DrawingSource {
	model(): EditorModel;
	scene(): ExposureScene;
	unitSystem(): UnitSystem;
	falloffVisible(): boolean;
	/** The part of the plan in view, or null before the stage has a size. */
	visibleBounds(): Bounds | null;
}

export class PlanDrawing {
	readonly #source: DrawingSource;
	#dimensionCache = new Map<string, DimensionLine>();
	#beamCache = new Map<string, Beam>();
	#bounceCache = new Map<string, BouncePath>();
	readonly #falloffService = new FalloffService();
	#stopEffects: (() => void) | null = null;

	constructor(source: DrawingSource) {
		this.#source = source;
		if (this.#falloffService.usesWorker) {
			this.#stopEffects = $effect.root(() => {
				$effect(() => {
					if (source.falloffVisible()) this.#falloffService.request(source.scene(), this.falloffBounds);
					else this.#falloffService.clear();
				});
			});
		}
	}

	/** Dimension lines from each light and card to the subject, with true 3-D distances. */
	readonly dimensions = $derived.by(() => {
		const { list, byId } = keepUnchanged(this.#dimensionCache, dimensionLines(this.#source.model(), this.#source.unitSystem()));
		this.#dimensionCache = byId;
		return list;
	});
	/** Each light's beam (angle, reach, kelvin). */
	readonly beams = $derived.by(() => {
		const { list, byId } = keepUnchanged(this.#beamCache, beams(this.#source.model()));
		this.#beamCache = byId;
		return list;
	});
	/** Each card's path from its light to the subject. */
	readonly bouncePaths = $derived.by(() => {
		const { list, byId } = keepUnchanged(this.#bounceCache, bouncePaths(this.#source.model()));
		this.#bounceCache = byId;
		return list;
	});
	/** The plan's extent with a margin: where the falloff map is computed. */
	readonly planBounds = $derived.by(() => {
		const b = boundsOfElements(Object.values(this.#source.model().elements)) ?? { minX: -0.2, minY: -0.2, maxX: 0.2, maxY: 0.2 };
		const margin = Math.max(0.1, 0.25 * Math.max(b.maxX - b.minX, b.maxY - b.minY));
		return expandBounds(b, margin);
	});
	/** Where the falloff map is computed: the whole table in view, and the plan's extent. */
	readonly falloffBounds = $derived.by<Bounds>(() => {
		const plan = this.planBounds;
		const seen = this.#source.visibleBounds();
		if (!seen) return plan;
		return { minX: Math.min(plan.minX, seen.minX), minY: Math.min(plan.minY, seen.minY), maxX: Math.max(plan.maxX, seen.maxX), maxY: Math.max(plan.maxY, seen.maxY) };
	});
	readonly #falloffHere = $derived.by<FalloffGrid | null>(() =>
		this.#source.falloffVisible() && !this.#falloffService.usesWorker ? falloffGrid(this.#source.scene(), this.falloffBounds) : null
	);
	/**
	 * The falloff map (stops relative to the subject), while it is switched on. In a browser it is
	 * computed in a worker and may lag a dragged light by one map; elsewhere it is computed on read.
	 */
	get falloff(): FalloffGrid | null {
		return this.#falloffService.usesWorker ? this.#falloffService.grid : this.#falloffHere;
	}

	destroy() {
		this.#stopEffects?.();
		this.#stopEffects = null;
		this.#falloffService.destroy();
	}
}
