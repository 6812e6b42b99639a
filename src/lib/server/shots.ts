// The shots service: upload, list, read, change, trash and restore the shots of a setup, serve their
// images, measure them. Every function asks authz first (src/lib/server/authz.ts), then calls the
// named queries in db/queries/shots.ts and the object store (storage.ts).
import { randomUUID } from 'node:crypto';
import { error } from '@sveltejs/kit';
import { and, eq, inArray } from 'drizzle-orm';
import { env } from '$env/dynamic/private';
import { authorizeSetup, authorizeShot, SHOT_NOT_FOUND } from '$lib/server/authz';
import { db } from '$lib/server/db';
import { setupRevisions, type Shot, type ShotMeasure } from '$lib/server/db/schema';
import {
	findShotRow,
	findSessionRow,
	forgetLeftovers,
	insertMeasure,
	listLeftovers,
	rememberLeftovers,
	insertShotRow,
	latestMeasures,
	listSessionRows,
	listShotRows,
	ticksOf,
	updateShotRow
} from '$lib/server/db/queries/shots';
import type { SessionUser } from '$lib/server/session';
import { RuleViolation } from '$lib/server/errors';
import { offsetFromLuminance, offsetFromMeter } from '$lib/shots/measure';
import type { ShotMeasureInput, ShotTyped, ShotUpdateInput } from '$lib/shots/types';
import { checkImage, formatBytes, measureRegionOf, processImage, type ImageLimits } from './shots/image';
import { checkFileName } from './shots/names';
import { predictShot, shotSettings, type ShotSettings } from './shots-exposure';
import { objectStore, StorageUnavailable } from './storage';

export const DEFAULT_SHOT_MAX_BYTES = 50 * 1024 * 1024;
/** Above any camera sold today (a 100-megapixel sensor), far below what would exhaust memory. */
export const DEFAULT_SHOT_MAX_PIXELS = 150_000_000;

export function shotLimits(): ImageLimits {
	const bytes = Number(env.SQUARELAW_SHOT_MAX_BYTES);
	const pixels = Number(env.SQUARELAW_SHOT_MAX_PIXELS);
	return {
		maxBytes: Number.isFinite(bytes) && bytes > 0 ? bytes : DEFAULT_SHOT_MAX_BYTES,
		maxPixels: Number.isFinite(pixels) && pixels > 0 ? pixels : DEFAULT_SHOT_MAX_PIXELS
	};
}

export const IMAGE_VARIANTS = ['original', 'preview', 'thumbnail'] as const;
export type ImageVariant = (typeof IMAGE_VARIANTS)[number];

export interface ShotView {
	id: string;
	setupId: string;
	sessionId: string | null;
	revisionNumber: number;
	fileName: string;
	contentType: string;
	byteSize: number;
	widthPx: number;
	heightPx: number;
	exif: Shot['exif'];
	typed: ShotTyped;
	settings: ShotSettings;
	createdAt: string;
	deletedAt: string | null;
	images: Record<ImageVariant, string>;
	predicted: { offsetStops: number | null; reason?: string };
	actual: { offsetStops: number; method: 'region' | 'meter'; region: ShotMeasure['region']; meanLuminance: number | null; meter: ShotMeasure['meter']; measuredAt: string } | null;
	/** actual − predicted, stops; null until both are known. */
	differenceStops: number | null;
}

async function revisionDocuments(setupId: string, numbers: number[]) {
	if (!numbers.length) return new Map<number, unknown>();
	const rows = await db
		.select({ number: setupRevisions.number, document: setupRevisions.document })
		.from(setupRevisions)
		.where(and(eq(setupRevisions.setupId, setupId), inArray(setupRevisions.number, [...new Set(numbers)])));
	return new Map(rows.map((r) => [r.number, r.document]));
}

function toView(shot: Shot, document: unknown, measure: ShotMeasure | undefined): ShotView {
	const settings = shotSettings(shot.exif, shot.typed);
	const prediction = document === undefined ? { ok: false as const, reason: 'the revision is missing' } : predictShot(document, settings);
	const predicted = prediction.ok ? { offsetStops: prediction.offsetStops } : { offsetStops: null, reason: prediction.reason };
	const actual = measure
		? {
				offsetStops: measure.actualOffsetStops,
				method: measure.method,
				region: measure.region,
				meanLuminance: measure.meanLuminance,
				meter: measure.meter,
				measuredAt: measure.createdAt.toISOString()
			}
		: null;
	const base = `/api/v1/setups/${shot.setupId}/shots/${shot.id}/image`;
	return {
		id: shot.id,
		setupId: shot.setupId,
		sessionId: shot.sessionId,
		revisionNumber: shot.revisionNumber,
		fileName: shot.fileName,
		contentType: shot.contentType,
		byteSize: shot.byteSize,
		widthPx: shot.widthPx,
		heightPx: shot.heightPx,
		exif: shot.exif,
		typed: shot.typed,
		settings,
		createdAt: shot.createdAt.toISOString(),
		deletedAt: shot.deletedAt?.toISOString() ?? null,
		images: { original: `${base}/original`, preview: `${base}/preview`, thumbnail: `${base}/thumbnail` },
		predicted,
		actual,
		differenceStops: actual && predicted.offsetStops !== null ? actual.offsetStops - predicted.offsetStops : null
	};
}

async function viewsOf(setupId: string, rows: Shot[]) {
	const docs = await revisionDocuments(setupId, rows.map((r) => r.revisionNumber));
	const measures = await latestMeasures(rows.map((r) => r.id));
	return rows.map((r) => toView(r, docs.get(r.revisionNumber), measures.get(r.id)));
}

async function viewOf(shot: Shot) {
	return (await viewsOf(shot.setupId, [shot]))[0];
}

export interface SessionView {
	id: string;
	shotOn: string;
	note: string;
	ticks: { item: string; tickedAt: string }[];
	shotCount: number;
	/** Mean of actual − predicted over the session's measured shots. */
	meanDifferenceStops: number | null;
}

function mean(values: number[]) {
	return values.length ? values.reduce((s, v) => s + v, 0) / values.length : null;
}

/** A setup's shots (or its trash), its shooting sessions with their ticks and means, and what the caller may do. */
export async function listShots(user: SessionUser | null, setupId: string, { trashed = false } = {}) {
	const { setup, access, canEdit } = await authorizeSetup(user, setupId, 'shots.view');
	const shots = await viewsOf(setupId, await listShotRows(setupId, { trashed }));
	const sessionRows = await listSessionRows(setupId);
	const ticks = await ticksOf(sessionRows.map((s) => s.id));
	const sessions: SessionView[] = sessionRows.map((s) => {
		const mine = shots.filter((shot) => shot.sessionId === s.id);
		return {
			id: s.id,
			shotOn: s.shotOn,
			note: s.note,
			ticks: ticks.filter((t) => t.sessionId === s.id).map((t) => ({ item: t.item, tickedAt: t.tickedAt.toISOString() })),
			shotCount: mine.length,
			meanDifferenceStops: mean(mine.map((m) => m.differenceStops).filter((d): d is number => d !== null))
		};
	});
	return {
		setupId,
		studioId: access.studioId,
		latestRevision: setup.latestRevision,
		canEdit: canEdit,
		shots,
		sessions,
		meanDifferenceStops: mean(shots.map((s) => s.differenceStops).filter((d): d is number => d !== null))
	};
}

export async function getShot(user: SessionUser | null, setupId: string, shotId: string, { includeTrashed = false } = {}) {
	const { shot } = await authorizeShot(user, setupId, shotId, 'shots.view', { includeTrashed });
	return viewOf(shot);
}

export interface UploadFile {
	name: string;
	type: string;
	bytes: () => Promise<Uint8Array>;
	size: number;
}

export interface UploadResult {
	created: ShotView[];
	failed: { fileName: string; message: string }[];
}

const keyOf = (setupId: string, shotId: string, variant: ImageVariant) => `shots/${setupId}/${shotId}/${variant}`;

/**
 * Stores each good file (original, preview, thumbnail, then its row) and says for each bad one what is
 * wrong; one bad file never stops the others. A file is all there or not at all: when storage or the
 * database fails part-way, the objects already written for it are removed again.
 */
export async function uploadShots(
	user: SessionUser | null,
	setupId: string,
	files: UploadFile[],
	{ sessionId = null, revisionNumber }: { sessionId?: string | null; revisionNumber?: number } = {}
): Promise<UploadResult> {
	const { setup } = await authorizeSetup(user, setupId, 'shots.edit');
	if (!files.length) throw new RuleViolation('Send at least one file (the form field "files").', 'files');
	if (sessionId && !(await findSessionRow(setupId, sessionId))) throw new RuleViolation('names no shooting session of this setup', 'sessionId');
	const revision = revisionNumber ?? setup.latestRevision;
	if (revision < 1 || revision > setup.latestRevision) throw new RuleViolation(`must be a revision of this setup (1 to ${setup.latestRevision})`, 'revisionNumber');
	const limits = shotLimits();
	await sweepStorageLeftovers();
	const result: UploadResult = { created: [], failed: [] };
	for (const file of files) {
		const name = checkFileName(file.name);
		const shown = name.ok ? name.name : visibleName(file.name);
		if (!name.ok) {
			result.failed.push({ fileName: shown, message: `${shown}: ${name.message}` });
			continue;
		}
		if (file.size > limits.maxBytes) {
			result.failed.push({ fileName: shown, message: `${shown}: the file is larger than the limit of ${formatBytes(limits.maxBytes)}` });
			continue;
		}
		const bytes = await file.bytes();
		const checked = await checkImage(bytes, limits);
		if (!checked.ok) {
			result.failed.push({ fileName: shown, message: `${shown}: ${checked.message}` });
			continue;
		}
		const id = randomUUID();
		const keys = { originalKey: keyOf(setupId, id, 'original'), previewKey: keyOf(setupId, id, 'preview'), thumbnailKey: keyOf(setupId, id, 'thumbnail') };
		try {
			const store = objectStore();
			// The original is written while sharp decodes it for the preview; a file that turns out corrupt
			// is removed again. If a write fails, every object of the file is removed below (one that never
			// arrived is no matter). processImage never throws, so no write is still going when that happens.
			const [, processed] = await Promise.all([store.put(keys.originalKey, bytes, checked.contentType), processImage(bytes, checked, limits)]);
			if (!processed.ok) {
				await removeQuietly([keys.originalKey]);
				result.failed.push({ fileName: shown, message: `${shown}: ${processed.message}` });
				continue;
			}
			// Both settled before any removal, so none lands after it.
			const puts = await Promise.allSettled([store.put(keys.previewKey, processed.preview, 'image/jpeg'), store.put(keys.thumbnailKey, processed.thumbnail, 'image/jpeg')]);
			const failed = puts.find((p) => p.status === 'rejected');
			if (failed) throw failed.reason;
			const takenAt = processed.exif.takenAt ? new Date(`${processed.exif.takenAt}Z`) : null;
			const row = await insertShotRow({
				id,
				setupId,
				sessionId,
				revisionNumber: revision,
				fileName: name.name,
				contentType: processed.contentType,
				byteSize: bytes.byteLength,
				widthPx: processed.widthPx,
				heightPx: processed.heightPx,
				...keys,
				exif: processed.exif,
				takenAt: takenAt && !Number.isNaN(takenAt.getTime()) ? takenAt : null,
				createdById: user!.id
			});
			result.created.push(await viewOf(row));
		} catch (e) {
			await removeQuietly(Object.values(keys));
			const why = e instanceof StorageUnavailable ? 'storage is unreachable' : 'it could not be saved';
			result.failed.push({ fileName: shown, message: `${shown}: not kept, ${why}; nothing of it was stored, try again` });
		}
	}
	return result;
}

/** Removes the objects of a failed upload; when storage is away, notes them for the next upload to remove. */
async function removeQuietly(keys: string[]) {
	if (!keys.length) return;
	try {
		await objectStore().remove(keys);
	} catch {
		await rememberLeftovers(keys).catch(() => {});
	}
}

/** Removes objects left by uploads that failed while storage was away (their rows never existed). */
export async function sweepStorageLeftovers() {
	const keys = await listLeftovers();
	if (!keys.length) return 0;
	try {
		await objectStore().remove(keys);
	} catch {
		return 0;
	}
	await forgetLeftovers(keys);
	return keys.length;
}

/** A name to show in a message when the name itself was refused: controls made visible, length bounded. */
function visibleName(raw: string) {
	const cleaned = [...raw.normalize('NFC')].map((c) => (/[\p{Cc}\p{Cf}]/u.test(c) ? '�' : c)).join('');
	return (cleaned.trim() || '(no name)').slice(0, 120);
}

export async function updateShot(user: SessionUser | null, setupId: string, shotId: string, input: ShotUpdateInput) {
	const { shot, setup } = await authorizeShot(user, setupId, shotId, 'shots.edit');
	const changes: Partial<Shot> = {};
	if (input.typed) {
		const typed: ShotTyped = { ...shot.typed };
		for (const [field, value] of Object.entries(input.typed) as [keyof ShotTyped, number | null | undefined][]) {
			if (value === null) delete typed[field];
			else if (value !== undefined) typed[field] = value;
		}
		changes.typed = typed;
	}
	if (input.revisionNumber !== undefined) {
		if (input.revisionNumber > setup.latestRevision) throw new RuleViolation(`must be a revision of this setup (1 to ${setup.latestRevision})`, 'revisionNumber');
		changes.revisionNumber = input.revisionNumber;
	}
	if (input.sessionId !== undefined) {
		if (input.sessionId && !(await findSessionRow(setupId, input.sessionId))) throw new RuleViolation('names no shooting session of this setup', 'sessionId');
		changes.sessionId = input.sessionId;
	}
	return viewOf(await updateShotRow(shot.id, changes));
}

/** To the trash: the row is marked, the objects stay until the shot is purged. */
export async function trashShot(user: SessionUser | null, setupId: string, shotId: string) {
	const { shot } = await authorizeShot(user, setupId, shotId, 'shots.edit');
	return viewOf(await updateShotRow(shot.id, { deletedAt: new Date() }));
}

export async function restoreShot(user: SessionUser | null, setupId: string, shotId: string) {
	const { shot } = await authorizeShot(user, setupId, shotId, 'shots.edit', { includeTrashed: true });
	return viewOf(await updateShotRow(shot.id, { deletedAt: null }));
}

/** An image of a shot, after authz: a shot of a setup the caller may not see is a 404 like any other. */
export async function shotImage(user: SessionUser | null, setupId: string, shotId: string, variant: string) {
	if (!(IMAGE_VARIANTS as readonly string[]).includes(variant)) error(404, `No such image: ask for ${IMAGE_VARIANTS.join(', ')}.`);
	const { shot } = await authorizeShot(user, setupId, shotId, 'shots.view', { includeTrashed: true });
	const key = variant === 'original' ? shot.originalKey : variant === 'preview' ? shot.previewKey : shot.thumbnailKey;
	const bytes = await readObject(key);
	return { bytes, contentType: variant === 'original' ? shot.contentType : 'image/jpeg', fileName: shot.fileName };
}

/**
 * Shots of a setup by id, for a reader whose right comes from elsewhere (an exercise's hand-in names
 * them): the views in the order asked, trashed shots included, missing ones left out.
 */
export async function shotViewsFor(setupId: string, shotIds: string[]): Promise<ShotView[]> {
	const rows = (await Promise.all(shotIds.map((id) => findShotRow(setupId, id)))).filter((r): r is Shot => r !== null);
	return viewsOf(setupId, rows);
}

/** One image of a shot, for a reader whose right comes from elsewhere (as shotViewsFor). */
export async function shotImageFor(setupId: string, shotId: string, variant: string) {
	if (!(IMAGE_VARIANTS as readonly string[]).includes(variant)) error(404, `No such image: ask for ${IMAGE_VARIANTS.join(', ')}.`);
	const shot = await findShotRow(setupId, shotId);
	if (!shot) error(404, SHOT_NOT_FOUND);
	const key = variant === 'original' ? shot.originalKey : variant === 'preview' ? shot.previewKey : shot.thumbnailKey;
	return { bytes: await readObject(key), contentType: variant === 'original' ? shot.contentType : 'image/jpeg', fileName: shot.fileName };
}

async function readObject(key: string) {
	try {
		const bytes = await objectStore().get(key);
		if (!bytes) error(404, 'The image is missing from storage.');
		return bytes;
	} catch (e) {
		if (e instanceof StorageUnavailable) error(503, 'Storage is unreachable for a moment; try again.');
		throw e;
	}
}

/** Measures the actual exposure of a shot: a region of its original, or a meter reading typed in. */
export async function measureShot(user: SessionUser | null, setupId: string, shotId: string, input: ShotMeasureInput) {
	const { shot } = await authorizeShot(user, setupId, shotId, 'shots.edit');
	if (input.method === 'meter') {
		const fNumber = shotSettings(shot.exif, shot.typed).fNumber;
		if (fNumber === null) throw new RuleViolation('the shot’s aperture is not recorded: type it in first', 'meter.aperture');
		await insertMeasure({
			shotId: shot.id,
			method: 'meter',
			meter: input.meter,
			actualOffsetStops: offsetFromMeter(input.meter.aperture, fNumber),
			createdById: user!.id
		});
		return viewOf(shot);
	}
	const original = await readObject(shot.originalKey);
	const measured = await measureRegionOf(original, input.region, shotLimits());
	const offset = offsetFromLuminance(measured.meanLuminance);
	if (offset === null) throw new RuleViolation('the region is black: choose a mid-grey card or a mid-tone', 'region');
	await insertMeasure({
		shotId: shot.id,
		method: 'region',
		region: input.region,
		meanLuminance: measured.meanLuminance,
		actualOffsetStops: offset,
		createdById: user!.id
	});
	return viewOf(shot);
}
