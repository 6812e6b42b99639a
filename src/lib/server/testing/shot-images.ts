// Images made for the shots tests with sharp: known pixels and known EXIF, so every expected value is
// known exactly. EXIF tags are written by name through libvips (IFD0 the main image, IFD2 the Exif IFD
// of CIPA DC-008); never imported by the app.
import sharp from 'sharp';

export interface TestImageOptions {
	width?: number;
	height?: number;
	/** The sRGB code of every pixel (R = G = B), or a colour. */
	grey?: number;
	rgb?: [number, number, number];
	format?: 'jpeg' | 'png' | 'tiff' | 'webp';
	/** EXIF Exif-IFD tags as libvips takes them, e.g. { FNumber: '16/1', ExposureTime: '1/125', ISOSpeedRatings: '100' }. */
	exif?: Record<string, string>;
	model?: string;
	/** Orientation 0x0112 (1–8). */
	orientation?: number;
}

export async function testImage({ width = 64, height = 48, grey = 118, rgb, format = 'jpeg', exif, model, orientation }: TestImageOptions = {}) {
	const [r, g, b] = rgb ?? [grey, grey, grey];
	let image = sharp({ create: { width, height, channels: 3, background: { r, g, b } } });
	image = format === 'jpeg' ? image.jpeg({ quality: 100, chromaSubsampling: '4:4:4' }) : format === 'png' ? image.png() : format === 'tiff' ? image.tiff() : image.webp({ lossless: true });
	if (exif || model) image = image.withExif({ IFD0: model ? { Model: model } : {}, IFD2: exif ?? {} });
	if (orientation) image = image.withMetadata({ orientation });
	return image.toBuffer();
}

/** The settings a shot of the sample document predicts about 0 stops at (see shots tests). */
export const SAMPLE_EXIF = { FNumber: '16/1', ExposureTime: '1/125', ISOSpeedRatings: '100', FocalLength: '100/1', Flash: '9', DateTimeOriginal: '2026:11:30 14:05:00', LensModel: 'Fernhill Macro 100' };
