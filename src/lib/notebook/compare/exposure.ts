/** The change in exposure between two revisions, in stops, worked out by the light engine from both scenes. */
import { computeExposure, type ExposureResult } from '$lib/light/scene';
import { formatFNumber, formatStops, roundSig } from '$lib/light/format';
import type { ExposureScene } from '$lib/light/schema';
import type { ComparableDocument } from './placement';
import { formatStopsDelta, shownStopsDelta } from './shown';
import type { ExposureChange, LightExposureEntry } from './index';

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

export function exposureChange(a: ComparableDocument, b: ComparableDocument, labelOf: (id: string) => string): ExposureChange {
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
	else if (shownStopsDelta(before, after) === 0) text = `Exposure unchanged: ${formatStops(after)} at ${at(b)}.`;
	else text = `Exposure ${formatStopsDelta(before, after)}: ${formatStops(before)} at ${at(a)} → ${formatStops(after)} at ${at(b)}.`;

	const lights: LightExposureEntry[] = [];
	const byIdA = new Map(ea.lights.map((l) => [l.id, l]));
	for (const lb of eb.lights) {
		const la = byIdA.get(lb.id);
		if (!la) continue;
		const d = la.stops !== null && lb.stops !== null ? lb.stops - la.stops : null;
		const same = la.stops === lb.stops || (la.stops !== null && lb.stops !== null && shownStopsDelta(la.stops, lb.stops) === 0);
		if (same) continue;
		const name = labelOf(lb.id);
		let t: string;
		if (la.stops !== null && lb.stops !== null) t = `${name}: ${formatStopsDelta(la.stops, lb.stops)} (${formatStops(la.stops)} → ${formatStops(lb.stops)})`;
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
	const ratioChanged = ratioText(ra) !== ratioText(rb);
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
