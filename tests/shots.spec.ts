// Shots in a real browser: three files uploaded at once (one corrupt) with progress, the EXIF of the
// good ones, a grey region measured on the preview, predicted, actual and difference, the flash
// calibrated from that shot, and the setup's predicted exposure changed by the calibrated amount on the
// next save; the checklist ticked and printed. Images are made with sharp: known pixels, known EXIF.
import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import { expect, signedInAs, test } from './fixtures';

const OWNER = 'mara.quill@fernhill.example';

test('upload, measure, calibrate and the checklist', async ({ page, context, browser, baseURL }) => {
	await signedInAs(context, browser, baseURL, OWNER);
	const req = page.request;
	const studios = await (await req.get('/api/v1/gear')).json();
	const studioId = studios.studioId as string;
	const flash = await (await req.post('/api/v1/gear', { data: { studioId, kind: 'flash', name: `Kestrel 40 ${randomUUID().slice(0, 6)}`, spec: { guideNumberM: 40, lowestPower: 1 / 128, syncSpeedS: 1 / 200 } } })).json();
	const document = {
		schemaVersion: 1,
		scene: {
			camera: { iso: 100, aperture: 16, shutter: 1 / 200, magnification: 0.5 },
			subject: { position: [0, 0, 0.04] },
			lights: [{ id: 'key', kind: 'flash', position: [-0.3, 0.2, 0.35], guideNumber: 40, power: 0.25, lossStops: 1.5 }]
		},
		plan: { elements: { key: { kind: 'flash', gearId: flash.id } } },
		notes: ''
	};
	const setup = await (await req.post('/api/v1/setups', { data: { studioId, title: `Shots ${randomUUID().slice(0, 6)}`, subject: 'quartz', document } })).json();
	const before = (await (await req.get(`/api/v1/setups/${setup.id}/exposure`)).json()).total.exposureOffsetStops as number;

	// A grey a stop under the prediction (the code whose linear value is 18 % × 2^(before − 1)), at the plan's settings.
	const target = 0.18 * 2 ** (before - 1);
	const lin = (c: number) => (c / 255 <= 0.04045 ? c / 255 / 12.92 : ((c / 255 + 0.055) / 1.055) ** 2.4);
	let code = 0;
	for (let c = 0; c < 256; c++) if (Math.abs(lin(c) - target) < Math.abs(lin(code) - target)) code = c;
	const exif = { IFD0: { Model: 'Fernhill Test Camera' }, IFD2: { FNumber: '16/1', ExposureTime: '1/200', ISOSpeedRatings: '100' } };
	const grey = await sharp({ create: { width: 600, height: 400, channels: 3, background: { r: code, g: code, b: code } } }).png().withExif(exif).toBuffer();
	const other = await sharp({ create: { width: 600, height: 400, channels: 3, background: { r: 90, g: 120, b: 150 } } }).jpeg().withExif(exif).toBuffer();
	const corrupt = other.subarray(0, other.length / 2);

	await page.goto(`/setups/${setup.id}`);
	await page.waitForLoadState('networkidle');
	const shots = page.getByTestId('shots');
	await shots.getByRole('button', { name: 'New session today' }).click();
	await page.getByTestId('shots-picker').setInputFiles([
		{ name: 'grey-card.png', mimeType: 'image/png', buffer: grey },
		{ name: 'quartz.jpg', mimeType: 'image/jpeg', buffer: other },
		{ name: 'broken.jpg', mimeType: 'image/jpeg', buffer: corrupt }
	]);
	const uploads = page.getByTestId('upload');
	await expect(uploads).toHaveCount(3);
	await expect(uploads.filter({ hasText: 'grey-card.png' })).toContainText('Stored');
	await expect(uploads.filter({ hasText: 'quartz.jpg' })).toContainText('Stored');
	await expect(uploads.filter({ hasText: 'broken.jpg' })).toContainText('broken.jpg: the image is truncated or corrupt');
	// Each file had its own bar, filled once its bytes were sent.
	await expect(uploads.filter({ hasText: 'grey-card.png' }).locator('progress')).toHaveJSProperty('position', 1);

	const card = page.getByTestId('shot').filter({ hasText: 'grey-card.png' });
	await expect(card.getByTestId('exif')).toContainText('f/16 · 1/200 s · ISO 100');
	await expect(page.getByTestId('shot').filter({ hasText: 'quartz.jpg' }).getByTestId('exif')).toContainText('f/16');
	await card.getByRole('button', { name: /Open grey-card.png/ }).click();

	const box = page.getByTestId('measure-box');
	await box.scrollIntoViewIfNeeded();
	const r = (await box.boundingBox())!;
	await page.mouse.move(r.x + r.width * 0.3, r.y + r.height * 0.3);
	await page.mouse.down();
	await page.mouse.move(r.x + r.width * 0.7, r.y + r.height * 0.7, { steps: 5 });
	await page.mouse.up();
	await expect(page.getByTestId('detail-comparison')).toContainText(/difference −1\.0 stops/);

	await page.getByLabel('Flash to calibrate').selectOption(flash.id);
	await page.getByRole('button', { name: 'Calibrate from this shot' }).click();
	await expect(page.getByTestId('calibrated')).toContainText(/−1\.0 stops against its label/);

	// The next save predicts with the calibrated flash: one stop less; revision 1 keeps its figure.
	const saved = await (await req.put(`/api/v1/setups/${setup.id}`, { data: { baseRevision: 1, document } })).json();
	const after = (await (await req.get(`/api/v1/setups/${setup.id}/exposure?revision=${saved.revisionNumber}`)).json()).total.exposureOffsetStops as number;
	expect(after - before).toBeCloseTo(-1, 1);
	expect((await (await req.get(`/api/v1/setups/${setup.id}/exposure?revision=1`)).json()).total.exposureOffsetStops).toBeCloseTo(before, 6);

	// The checklist, ticked and printed.
	await shots.getByLabel('Lens on manual focus').check();
	await expect(shots.getByLabel('Lens on manual focus')).toBeChecked();
	await page.reload();
	await page.waitForLoadState('networkidle');
	await expect(page.getByTestId('shots').getByLabel('Lens on manual focus')).toBeChecked();
	await page.emulateMedia({ media: 'print' });
	await expect(page.getByTestId('printed-checklist')).toBeVisible();
	await expect(page.getByTestId('printed-checklist')).toContainText('☑ Lens on manual focus');
	await expect(page.getByTestId('printed-checklist')).toContainText('☐ Tripod legs and head locked');
});
