// Shot images with known pixels and EXIF, made with sharp (src/lib/server/testing/shot-images.ts).
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { srgbToLinear } from '$lib/shots/measure';
import { SAMPLE_EXIF, testImage } from '$lib/server/testing/shot-images';
import { checkImage, measureRegionOf, processImage, readExif } from './image';
import { checkFileName } from './names';

const limits = { maxBytes: 5 * 1024 * 1024, maxPixels: 4_000_000 };

/** The header check, then the decode, as an upload does them. */
async function checkAndProcess(bytes: Uint8Array) {
	const checked = await checkImage(bytes, limits);
	return checked.ok ? processImage(bytes, checked, limits) : checked;
}

describe('EXIF (tag numbers and types from CIPA DC-008)', () => {
	it('reads FNumber 0x829D, ExposureTime 0x829A (RATIONAL), PhotographicSensitivity 0x8827, FocalLength 0x920A, Flash 0x9209, DateTimeOriginal 0x9003, Model 0x0110, LensModel 0xA434', async () => {
		const exif = await readExif(await testImage({ exif: SAMPLE_EXIF, model: 'Fernhill Test Camera' }));
		expect(exif).toEqual({
			fNumber: 16,
			exposureTimeS: 1 / 125,
			iso: 100,
			focalLengthMm: 100,
			// Flash 9 = 0b1001: fired (bit 0), mode 1 (bits 3–4) compulsory firing.
			flashFired: true,
			flashMode: 'compulsory firing',
			takenAt: '2026-11-30T14:05:00',
			cameraModel: 'Fernhill Test Camera',
			lensModel: 'Fernhill Macro 100',
			rejected: []
		});
	});
	it('says "not recorded" (null) for a file without EXIF', async () => {
		const exif = await readExif(await testImage({ format: 'png' }));
		expect([exif.fNumber, exif.exposureTimeS, exif.iso, exif.cameraModel]).toEqual([null, null, null, null]);
	});
	it('drops absurd values (f/0, ISO 0, a negative time wrapped into a huge RATIONAL) and says why', async () => {
		const exif = await readExif(await testImage({ exif: { FNumber: '0/1', ISOSpeedRatings: '0', ExposureTime: '-1/125' } }));
		expect([exif.fNumber, exif.iso, exif.exposureTimeS]).toEqual([null, null, null]);
		expect(exif.rejected.map((r) => r.field).sort()).toEqual(['exposureTimeS', 'fNumber', 'iso']);
	});
});

describe('processing an upload', () => {
	it('keeps JPEG, PNG, TIFF and WebP, with an upright preview and thumbnail', async () => {
		for (const format of ['jpeg', 'png', 'tiff', 'webp'] as const) {
			const done = await checkAndProcess(await testImage({ format, width: 2000, height: 1000 }));
			expect(done.ok, format).toBe(true);
			if (!done.ok) continue;
			expect(done.contentType).toBe(`image/${format}`);
			expect(await sharp(done.preview).metadata()).toMatchObject({ format: 'jpeg', width: 1600, height: 800 });
			expect(await sharp(done.thumbnail).metadata()).toMatchObject({ width: 320, height: 160 });
		}
	});
	it('applies EXIF orientation 6 (rotate 90° clockwise, CIPA DC-008 0x0112): a 64 × 48 file shows 48 × 64', async () => {
		const done = await checkAndProcess(await testImage({ width: 64, height: 48, orientation: 6 }));
		expect(done.ok && [done.widthPx, done.heightPx]).toEqual([48, 64]);
		if (done.ok) expect(await sharp(done.preview).metadata()).toMatchObject({ width: 48, height: 64 });
	});
	it('refuses an empty file, a file over the limit, a file that is not an image and a truncated JPEG', async () => {
		const jpeg = await testImage({ width: 400, height: 300, rgb: [200, 30, 90] });
		const cases: [Uint8Array, RegExp][] = [
			[new Uint8Array(0), /empty/],
			[new Uint8Array(limits.maxBytes + 1), /larger than the limit of 5 MB/],
			[new TextEncoder().encode('%PDF-1.7 not an image at all'), /not an image/],
			[jpeg.subarray(0, Math.floor(jpeg.length / 2)), /truncated or corrupt/]
		];
		for (const [bytes, message] of cases) {
			const done = await checkAndProcess(bytes);
			expect(done.ok).toBe(false);
			if (!done.ok) expect(done.message).toMatch(message);
		}
	});
	it('refuses a decompression bomb by its declared size before decoding it (sharp’s pixel limit)', async () => {
		// 10 000 × 10 000 of one colour: a PNG of a few hundred kilobytes that would decode to 300 MB.
		const bomb = await sharp({ create: { width: 10_000, height: 10_000, channels: 3, background: '#000' } }).png({ compressionLevel: 9 }).toBuffer();
		expect(bomb.length).toBeLessThan(limits.maxBytes);
		const done = await checkImage(bomb, limits);
		expect(done.ok).toBe(false);
		if (!done.ok) expect(done.message).toMatch(/10000 × 10000 pixels, more than the limit of 4 megapixels/);
	});
});

describe('measuring a region (IEC 61966-2-1 decoding, ITU-R BT.709 luminance)', () => {
	it('measures uniform sRGB 118 grey as 18 % linear, about 0 stops', async () => {
		const png = await testImage({ format: 'png', grey: 118, width: 200, height: 100 });
		const m = await measureRegionOf(png, { x: 0.25, y: 0.25, width: 0.5, height: 0.5 }, limits);
		expect(m.meanLuminance).toBeCloseTo(srgbToLinear(118 / 255), 10);
		expect(Math.log2(m.meanLuminance / 0.18)).toBeCloseTo(0.01, 2);
		expect(m.pixels).toEqual({ left: 50, top: 25, width: 100, height: 50 });
	});
	it('measures only the region: a white left half and a black right half', async () => {
		const half = await sharp({ create: { width: 100, height: 50, channels: 3, background: '#000' } })
			.composite([{ input: { create: { width: 50, height: 50, channels: 3, background: '#fff' } }, left: 0, top: 0 }])
			.png()
			.toBuffer();
		expect((await measureRegionOf(half, { x: 0, y: 0, width: 0.5, height: 1 }, limits)).meanLuminance).toBeCloseTo(1, 10);
		expect((await measureRegionOf(half, { x: 0.5, y: 0, width: 0.5, height: 1 }, limits)).meanLuminance).toBe(0);
	});
	it('weighs colours by Rec. 709: pure sRGB green is 0.7152', async () => {
		const green = await testImage({ format: 'png', rgb: [0, 255, 0] });
		expect((await measureRegionOf(green, { x: 0, y: 0, width: 1, height: 1 }, limits)).meanLuminance).toBeCloseTo(0.7152, 10);
	});
	it('takes the region in the upright picture (orientation 6)', async () => {
		// Stored 100 × 50 with the left half white; shown upright (turned 90° clockwise) the white is on top.
		const stored = await sharp({ create: { width: 100, height: 50, channels: 3, background: '#000' } })
			.composite([{ input: { create: { width: 50, height: 50, channels: 3, background: '#fff' } }, left: 0, top: 0 }])
			.jpeg({ quality: 100 })
			.withMetadata({ orientation: 6 })
			.toBuffer();
		expect((await measureRegionOf(stored, { x: 0.1, y: 0.05, width: 0.8, height: 0.35 }, limits)).meanLuminance).toBeGreaterThan(0.95);
		expect((await measureRegionOf(stored, { x: 0.1, y: 0.6, width: 0.8, height: 0.35 }, limits)).meanLuminance).toBeLessThan(0.05);
	});
});

describe('file names', () => {
	it('takes plain names and odd-but-fine Unicode, normalised to NFC', () => {
		expect(checkFileName('quartz 01.jpg')).toEqual({ ok: true, name: 'quartz 01.jpg' });
		expect(checkFileName('ammonite-e\u0301.jpg')).toEqual({ ok: true, name: 'ammonite-é.jpg' });
	});
	it('refuses paths, controls and direction overrides', () => {
		for (const bad of ['../../etc/passwd', 'C:\\shots\\a.jpg', 'a\u0000b.jpg', 'gpj.\u202eexe', '', '..']) {
			expect(checkFileName(bad).ok, JSON.stringify(bad)).toBe(false);
		}
	});
});
