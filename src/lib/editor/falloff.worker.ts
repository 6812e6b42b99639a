/// <reference lib="webworker" />
/**
 * The falloff map computed off the main thread, so a drag keeps its frame rate however many lights
 * the plan has. Receives `{ id, scene, bounds, maxCells }`, answers `{ id, grid }` with the cell
 * values transferred, not copied.
 */
import { falloffGrid, FalloffShares } from './falloff';
import type { FalloffRequest, FalloffResponse } from './falloff-service.svelte';

/** Each light's share, kept between maps: a drag works out again only what moved. */
const shares = new FalloffShares();

self.onmessage = (event: MessageEvent<FalloffRequest>) => {
	const { id, scene, bounds, maxCells } = event.data;
	try {
		const grid = falloffGrid(scene, bounds, maxCells, shares);
		const answer: FalloffResponse = { id, grid };
		(self as unknown as Worker).postMessage(answer, [grid.stops.buffer]);
	} catch (e) {
		const answer: FalloffResponse = { id, error: e instanceof Error ? e.message : String(e) };
		(self as unknown as Worker).postMessage(answer);
	}
};
