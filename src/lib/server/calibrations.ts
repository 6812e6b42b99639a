// Flash calibration: how far a gear-shelf flash is from its guide number, in stops, worked out from a
// test shot (its measure against the plan's prediction) or a flash-meter reading, or typed on the gear
// form. Each one recorded becomes the flash's `calibrationOffsetStops` on the shelf (the one figure
// plans use: snapshotGear copies it into setups saved from then on) and is kept dated in
// flash_calibrations. Undo marks one undone and puts the one before it (or none) in force; nothing is lost.
import { error } from '@sveltejs/kit';
import { authorizeGear, authorizeSetup, authorizeShot } from '$lib/server/authz';
import { calibrationsOf, latestMeasures, offsetOfCalibration, recordCalibration, undoCalibrationRow } from '$lib/server/db/queries/shots';
import { findRevision } from '$lib/server/db/queries/setups';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { flashSpecSchema } from '$lib/scene/gear';
import { calibrationOffsetStops, FLASH_DOMINANCE_SHARE, guideNumberFromMeter, guideNumberFromShot } from '$lib/shots/measure';
import type { CalibrationInput } from '$lib/shots/types';
import { flashShareOf, predictShot, shotSettings } from './shots-exposure';
import type { FlashCalibration } from '$lib/server/db/schema';
import { formatStops } from '$lib/light/format';

/** The range of a calibration on the shelf and in the scene (`calibrationOffsetStopsField`). */
const MAX_CALIBRATION_STOPS = 5;

export interface CalibrationView {
	id: string;
	gearId: string;
	method: FlashCalibration['method'];
	guideNumberM: number;
	ratedGuideNumberM: number;
	/** How far the flash is from its label: 2·log2(measured / rated) stops. */
	offsetStops: number;
	shotId: string | null;
	reading: FlashCalibration['reading'];
	createdAt: string;
	undoneAt: string | null;
	active: boolean;
}

function toView(row: FlashCalibration, activeId: string | null): CalibrationView {
	return {
		id: row.id,
		gearId: row.gearId,
		method: row.method,
		guideNumberM: row.guideNumberM,
		ratedGuideNumberM: row.ratedGuideNumberM,
		offsetStops: offsetOfCalibration(row),
		shotId: row.shotId,
		reading: row.reading,
		createdAt: row.createdAt.toISOString(),
		undoneAt: row.undoneAt?.toISOString() ?? null,
		active: row.id === activeId
	};
}

async function flashOnShelf(user: SessionUser | null, gearId: string, capability: 'gear.view' | 'gear.edit') {
	const { row } = await authorizeGear(user, gearId, capability);
	if (row.kind !== 'flash') throw new RuleViolation('names gear that is not a flash', 'gearId');
	const spec = flashSpecSchema.safeParse(row.spec);
	if (!spec.success) throw new RuleViolation('the flash’s shelf entry has no valid guide number', 'gearId');
	return { row, ratedGuideNumberM: spec.data.guideNumberM };
}

/** A flash's calibrations, newest first; the first not undone is in force. */
export async function listCalibrations(user: SessionUser | null, gearId: string) {
	await flashOnShelf(user, gearId, 'gear.view');
	const rows = await calibrationsOf(gearId);
	const activeId = rows.find((r) => !r.undoneAt)?.id ?? null;
	return { gearId, calibrations: rows.map((r) => toView(r, activeId)) };
}

/**
 * Works out and stores a calibration. From a shot: the shot must be measured, and the flash must give at
 * least nine tenths of the planned light (else a 400 saying how much comes from elsewhere; the rest is
 * taken as planned). From a reading: GN = N × d / (√(ISO/100) · √power · 2^(−loss/2)).
 */
export async function calibrateFlash(user: SessionUser | null, setupId: string, input: CalibrationInput) {
	const { row: flash, ratedGuideNumberM } = await flashOnShelf(user, input.gearId, 'gear.edit');
	let guideNumberM: number;
	let shotId: string | null = null;
	let reading: FlashCalibration['reading'];
	const warnings: string[] = [];
	if (input.method === 'meter') {
		await authorizeSetup(user, setupId, 'shots.edit');
		reading = { aperture: input.aperture, distanceM: input.distanceM, iso: input.iso, power: input.power, lossStops: input.lossStops };
		guideNumberM = guideNumberFromMeter(reading);
	} else {
		const { shot, setup } = await authorizeShot(user, setupId, input.shotId, 'shots.edit');
		if (setup.studioId !== flash.studioId) throw new RuleViolation('names a flash of another studio’s shelf', 'gearId');
		const measure = (await latestMeasures([shot.id])).get(shot.id);
		if (!measure) throw new RuleViolation('measure the shot first (a grey region or a meter reading)', 'shotId');
		const found = await findRevision(setupId, shot.revisionNumber);
		const prediction = found ? predictShot(found.revision.document, shotSettings(shot.exif, shot.typed)) : { ok: false as const, reason: 'the revision is missing' };
		if (!prediction.ok || prediction.offsetStops === null) throw new RuleViolation(`no prediction for this shot: ${prediction.ok ? 'the plan gives no light' : prediction.reason}`, 'shotId');
		const { share, offsetStops, lightIds } = flashShareOf(prediction, flash.id);
		if (!lightIds.length) throw new RuleViolation('the shot’s revision uses no light drawn from this flash', 'gearId');
		if (share < FLASH_DOMINANCE_SHARE) {
			warnings.push(`The plan says ${Math.round((1 - share) * 100)} % of the light at the subject comes from ambient or other lights; the calibration takes those as planned.`);
		}
		const difference = measure.actualOffsetStops - prediction.offsetStops;
		// The prediction already used the revision's calibration: the new one is measured on top of it.
		const real = guideNumberFromShot(ratedGuideNumberM * 2 ** (offsetStops / 2), difference, share);
		if (real === null) throw new RuleViolation('the measure leaves this flash no light of its own: the other sources alone explain it', 'shotId');
		guideNumberM = real;
		shotId = shot.id;
		reading = { differenceStops: difference, flashShare: share };
	}
	const field = input.method === 'meter' ? 'aperture' : 'shotId';
	if (!Number.isFinite(guideNumberM) || guideNumberM <= 0 || guideNumberM > 1000) {
		throw new RuleViolation(`the reading gives a guide number of ${guideNumberM.toFixed(1)} m, outside 0–1000`, field);
	}
	const offsetStops = calibrationOffsetStops({ guideNumberM, ratedGuideNumberM });
	if (Math.abs(offsetStops) > MAX_CALIBRATION_STOPS) {
		throw new RuleViolation(`the reading puts the flash ${formatStops(offsetStops)} from its guide number of ${ratedGuideNumberM} m, more than ${MAX_CALIBRATION_STOPS}: check the reading`, field);
	}
	const row = await recordCalibration({ gearId: flash.id, method: input.method, guideNumberM, ratedGuideNumberM, shotId, reading, createdById: user!.id });
	return { calibration: toView(row, row.id), warnings };
}

export async function undoCalibration(user: SessionUser | null, gearId: string, calibrationId: string) {
	await flashOnShelf(user, gearId, 'gear.edit');
	const row = await undoCalibrationRow(gearId, calibrationId);
	if (!row) error(404, 'No such calibration in force on this flash.');
	return listCalibrations(user, gearId);
}
