/**
 * The commands that take their figures from the gear shelf or from the engine: a flash, a camera body
 * or a lens from the shelf, and a flash set to the power the setup needs. Commands like those in
 * commands.ts (a reversible diff or a refusal naming the field), kept apart because only the inspector
 * runs them: they load with it, not with the editor's first paint.
 */
import { ok, refuse, type Command, type CommandResult } from './commands';
import { setCameraSettings, setElementProperties } from './commands-properties';
import { powerNeeded } from './model/power-needed';
import type { CameraSettings } from './model/schema';
import type { ShelfGear } from './model/shelf';
import { LOWEST_POWER } from '$lib/light/flash';
import { sceneFlashFromShelf } from '$lib/scene/gear';
import type { EditorModel } from './model/types';

/**
 * A flash element's figures from a shelf flash (`sceneFlashFromShelf`, the one mapping from the shelf
 * to the scene): its rated guide number and, beside it, its calibration in stops, which the engine
 * applies. Its ladder ends at its lowest power.
 */
export function flashFiguresFromShelf(flash: ShelfGear<'flash'>, zoomMm = flash.spec.zoomMm) {
	const s = flash.spec;
	const light = sceneFlashFromShelf(s, zoomMm);
	return {
		gearId: flash.id,
		guideNumber: light.guideNumber,
		calibrationOffsetStops: light.calibrationOffsetStops ?? 0,
		lowestPower: Math.max(LOWEST_POWER, light.lowestPower),
		zoomMm: zoomMm ?? null,
		mainsPowered: s.mainsPowered ?? false,
		...(s.kelvin !== undefined ? { kelvin: s.kelvin } : {})
	};
}

/**
 * A flash's guide number and calibration, ladder, zoom, kelvin and mains caution from a
 * shelf flash; null: the figures stay and the flash no longer names a shelf item (typed by hand).
 * A power below the flash's lowest step is raised to it (the flash cannot go lower).
 */
export function takeFlashFromShelf(id: string, flash: ShelfGear<'flash'> | null): Command {
	return (model) => {
		const el = model.elements[id];
		if (!el || el.kind !== 'flash') return refuse('select a flash', ['gearId']);
		if (!flash) return setElementProperties(id, { gearId: undefined })(model);
		const figures = flashFiguresFromShelf(flash);
		return setElementProperties(id, { ...figures, power: Math.max(el.power, figures.lowestPower) })(model);
	};
}

/** One diff that changes a camera element and the camera settings together (one undo step). */
function cameraChange(model: EditorModel, id: string, elementPatch: Record<string, unknown>, settingsPatch: Partial<CameraSettings>): CommandResult {
	const el = model.elements[id];
	if (!el || el.kind !== 'camera') return refuse('select the camera');
	const element = setElementProperties(id, elementPatch)(model);
	if (!element.ok) return element;
	if (!Object.keys(settingsPatch).length) return element;
	const settings = setCameraSettings(settingsPatch)(model);
	if (!settings.ok) return settings;
	return ok({ ...element.diff, camera: settings.diff.camera });
}

/** A camera body from the shelf: its sensor (field of view), circle of confusion and sync speed. */
export function takeCameraFromShelf(id: string, body: ShelfGear<'camera'> | null): Command {
	return (model) => {
		if (!body) return cameraChange(model, id, { gearId: undefined }, {});
		const s = body.spec;
		return cameraChange(model, id, { gearId: body.id, sensorWidthMm: s.sensorWidthMm, sensorHeightMm: s.sensorHeightMm }, { cocMm: s.cocMm, syncSpeed: s.syncSpeedS });
	};
}

/**
 * A lens from the shelf: its focal length (field of view), pupil magnification (working aperture) and
 * marked aperture range (the aperture table's rows).
 */
export function takeLensFromShelf(id: string, lens: ShelfGear<'lens'> | null): Command {
	return (model) => {
		if (!lens) return cameraChange(model, id, { lens: null }, {});
		const s = lens.spec;
		return cameraChange(
			model,
			id,
			{ lens: { name: lens.name.slice(0, 200), gearId: lens.id, pupilMagnification: s.pupilMagnification }, focalLengthMm: s.focalLengthMm },
			{ pupilMagnification: s.pupilMagnification, minAperture: s.widestAperture, maxAperture: s.narrowestAperture }
		);
	};
}

/** Sets a flash to the ladder step nearest the power the setup needs for a correct exposure (`powerNeeded`). */
export function setPowerToNeeded(id: string): Command {
	return (model) => {
		const needed = powerNeeded(model, id);
		if (!needed.ok) return refuse(needed.message, ['power']);
		return setElementProperties(id, { power: needed.step.fraction })(model);
	};
}
