// What the server does with an uploaded image: checks it is one (sharp decodes it, within a pixel limit
// against decompression bombs), reads its EXIF (exifr), makes an upright thumbnail and preview, and
// measures a region of the original. Everything happens in memory; nothing touches the disk.
import exifr from 'exifr';
import sharp, { type Metadata, type SharpOptions } from 'sharp';
import type { MeasureRegion, ShotExif } from '$lib/shots/types';
import { meanLuminance8 } from '$lib/shots/measure';

/** Formats sharp reads that we keep: JPEG, PNG, TIFF, WebP, and HEIF/AVIF where sharp's build reads them. */
const KEPT_FORMATS: Record<string, string> = {
	jpeg: 'image/jpeg',
	png: 'image/png',
	tiff: 'image/tiff',
	webp: 'image/webp',
	heif: 'image/heif'
};

export const THUMBNAIL_PX = 320;
export const PREVIEW_PX = 1600;

export interface ImageLimits {
	maxBytes: number;
	maxPixels: number;
}

export type CheckedImage = { ok: true; contentType: string; meta: Metadata } | { ok: false; message: string };

export type ProcessedImage =
	| {
			ok: true;
			contentType: string;
			widthPx: number;
			heightPx: number;
			exif: ShotExif;
			thumbnail: Buffer;
			preview: Buffer;
	  }
	| { ok: false; message: string };

/** The upright size: EXIF orientations 5–8 turn the picture a quarter (CIPA DC-008, Orientation 0x0112). */
function uprightSize(meta: Metadata) {
	const turned = (meta.orientation ?? 1) >= 5;
	const w = meta.width ?? 0;
	const h = meta.height ?? 0;
	return turned ? { widthPx: h, heightPx: w } : { widthPx: w, heightPx: h };
}

const options = (limits: Pick<ImageLimits, 'maxPixels'>): SharpOptions => ({
	limitInputPixels: limits.maxPixels,
	// A truncated or corrupt file is refused, never half-decoded into a grey thumbnail.
	failOn: 'warning',
	sequentialRead: true
});

/** Whether the bytes are an image of a kind we keep and within the limits, from its header alone (no pixels decoded). */
export async function checkImage(bytes: Uint8Array, limits: ImageLimits): Promise<CheckedImage> {
	if (bytes.byteLength === 0) return { ok: false, message: 'the file is empty' };
	if (bytes.byteLength > limits.maxBytes) return { ok: false, message: `the file is larger than the limit of ${formatBytes(limits.maxBytes)}` };
	let meta: Metadata;
	try {
		// Without the pixel limit, so a bomb is named by its size below.
		meta = await sharp(bytes, { limitInputPixels: false }).metadata();
	} catch {
		return { ok: false, message: 'this is not an image Squarelaw can read (JPEG, PNG, TIFF or WebP)' };
	}
	const contentType = meta.format ? KEPT_FORMATS[meta.format] : undefined;
	if (!contentType) return { ok: false, message: `images of this kind (${meta.format ?? 'unknown'}) are not taken: send JPEG, PNG, TIFF or WebP` };
	const pixels = (meta.width ?? 0) * (meta.height ?? 0);
	if (pixels > limits.maxPixels) {
		return { ok: false, message: `the image is ${meta.width} × ${meta.height} pixels, more than the limit of ${Math.round(limits.maxPixels / 1e6)} megapixels` };
	}
	return { ok: true, contentType, meta };
}

/** Decodes a checked image into its preview and thumbnail and reads its EXIF; a truncated or corrupt file is refused here. */
export async function processImage(bytes: Uint8Array, checked: CheckedImage & { ok: true }, limits: ImageLimits): Promise<ProcessedImage> {
	try {
		const upright = sharp(bytes, options(limits)).rotate();
		// One decode, two sizes: the preview first, the thumbnail from the preview.
		const preview = await upright
			.resize(PREVIEW_PX, PREVIEW_PX, { fit: 'inside', withoutEnlargement: true })
			.jpeg({ quality: 85 })
			.toBuffer();
		const thumbnail = await sharp(preview).resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 80 }).toBuffer();
		return { ok: true, contentType: checked.contentType, ...uprightSize(checked.meta), exif: await readExif(bytes), thumbnail, preview };
	} catch (e) {
		const detail = e instanceof Error ? e.message.split('\n')[0] : '';
		return { ok: false, message: `the image is truncated or corrupt and could not be decoded${detail ? ` (${detail})` : ''}` };
	}
}

export function formatBytes(n: number) {
	return n >= 1024 * 1024 ? `${Math.round((n / (1024 * 1024)) * 10) / 10} MB` : `${Math.round(n / 1024)} KB`;
}

const NOT_RECORDED: ShotExif = {
	fNumber: null,
	exposureTimeS: null,
	iso: null,
	focalLengthMm: null,
	flashFired: null,
	flashMode: null,
	takenAt: null,
	cameraModel: null,
	lensModel: null,
	rejected: []
};

/** Flash 0x9209 bits 3–4 (CIPA DC-008 §4.6.5): the flash mode. */
const FLASH_MODES: Record<number, string> = { 0: 'unknown', 1: 'compulsory firing', 2: 'compulsory suppression', 3: 'auto' };

/** Reads the settings we use from EXIF; values that cannot be right are dropped and listed in `rejected`. */
export async function readExif(bytes: Uint8Array): Promise<ShotExif> {
	let raw: Record<string, unknown> | undefined;
	try {
		raw = await exifr.parse(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), {
			tiff: true,
			exif: true,
			gps: false,
			interop: false,
			ifd1: false,
			xmp: false,
			icc: false,
			iptc: false,
			translateValues: false,
			reviveValues: false,
			pick: ['FNumber', 'ExposureTime', 'ISO', 'PhotographicSensitivity', 'FocalLength', 'Flash', 'DateTimeOriginal', 'Model', 'LensModel']
		});
	} catch {
		raw = undefined;
	}
	if (!raw) return { ...NOT_RECORDED, rejected: [] };
	const rejected: ShotExif['rejected'] = [];
	const number = (field: string, value: unknown, ok: (v: number) => boolean, reason: string): number | null => {
		const v = Array.isArray(value) ? value[0] : value;
		if (v === undefined || v === null) return null;
		if (typeof v !== 'number' || !Number.isFinite(v) || !ok(v)) {
			rejected.push({ field, value: String(v), reason });
			return null;
		}
		return v;
	};
	const text = (value: unknown) => (typeof value === 'string' && value.trim() ? value.replace(/\0/g, '').trim().slice(0, 200) : null);
	const flash = typeof raw.Flash === 'number' ? raw.Flash : null;
	return {
		fNumber: number('fNumber', raw.FNumber, (v) => v >= 0.5 && v <= 512, 'an f-number must be between 0.5 and 512'),
		exposureTimeS: number('exposureTimeS', raw.ExposureTime, (v) => v > 0 && v <= 100_000, 'an exposure time must be above 0 s'),
		iso: number('iso', raw.ISO ?? raw.PhotographicSensitivity, (v) => v >= 1 && v <= 10_000_000, 'an ISO must be at least 1'),
		focalLengthMm: number('focalLengthMm', raw.FocalLength, (v) => v > 0 && v <= 5000, 'a focal length must be above 0 mm'),
		flashFired: flash === null ? null : (flash & 1) === 1,
		flashMode: flash === null ? null : FLASH_MODES[(flash >> 3) & 3],
		takenAt: exifDate(raw.DateTimeOriginal),
		cameraModel: text(raw.Model),
		lensModel: text(raw.LensModel),
		rejected
	};
}

/** DateTimeOriginal 0x9003 is "YYYY:MM:DD HH:MM:SS" in the camera's local time (no zone): kept as written. */
function exifDate(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const m = /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})/.exec(value.trim());
	if (!m || m[1] === '0000') return null;
	return `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6]}`;
}

/**
 * Mean linear Rec. 709 luminance of a region of the original, given in fractions of the upright
 * picture (as the preview shows it). The original is decoded at full size: the camera's pixels, not a
 * resampled preview's, are what is measured.
 */
export async function measureRegionOf(bytes: Uint8Array, region: MeasureRegion, limits: Pick<ImageLimits, 'maxPixels'>) {
	const image = sharp(bytes, options(limits)).rotate();
	const meta = await sharp(bytes, { limitInputPixels: false }).metadata();
	const { widthPx, heightPx } = uprightSize(meta);
	const left = Math.min(widthPx - 1, Math.floor(region.x * widthPx));
	const top = Math.min(heightPx - 1, Math.floor(region.y * heightPx));
	const width = Math.max(1, Math.min(widthPx - left, Math.round(region.width * widthPx)));
	const height = Math.max(1, Math.min(heightPx - top, Math.round(region.height * heightPx)));
	const { data, info } = await image
		.extract({ left, top, width, height })
		.toColourspace('srgb')
		.raw({ depth: 'uchar' })
		.toBuffer({ resolveWithObject: true });
	return { meanLuminance: meanLuminance8(data, info.channels), pixels: { left, top, width, height } };
}
