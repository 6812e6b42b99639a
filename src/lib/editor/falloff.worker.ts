/// <reference lib="webworker" />
/**
 * The falloff map computed off the main thread, so a drag keeps its frame rate however many lights
 * the plan has. Receives `{ id, scene, bounds, maxCells }`, answers `{ id, grid }` with the cell
 * values transferred, not copied.
 */
import { falloffGrid } from './falloff';
import type { FalloffRequest, FalloffResponse } from './falloff-service.svelte';

self.onmessage = (event: MessageEvent<FalloffRequest>) => {
	const { id, scene, bounds, maxCells } = event.data;
	try {
		const grid = falloffGrid(scene, bounds, maxCells);
		const answer: FalloffResponse = { id, grid };
		(self as unknown as Worker).postMessage(answer, [grid.stops.buffer]);
	} catch (e) {
		const answer: FalloffResponse = { id, error: e instanceof Error ? e.message : String(e) };
		(self as unknown as Worker).postMessage(answer);
	}
};
