// The gear shelf's page forms through the running app (TEST_BASE_URL) and its real database: add,
// edit and retire call the gear services with the gear API's schemas; these check each answer as the
// page shows it: success, each message beside its input, 403 and 404 refusals. Nothing is mocked.
import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { gear } from '$lib/server/db/schema';
import { baseUrl, makeStudio, postAction, type TestStudio } from '$lib/server/testing/notebook-fixtures';
import { createGear } from '$lib/server/gear';

let studio: TestStudio;

beforeAll(async () => {
	baseUrl(); // fails at once when the app is not running
	studio = await makeStudio('Gear forms');
});

/** The flash form as a person fills it in. */
function flashForm(overrides: Record<string, string> = {}): Record<string, string> {
	return {
		kind: 'flash',
		studioId: studio.studioId,
		name: 'Kestrel 40 speedlight',
		'spec.guideNumberM': '40',
		'spec.lowestPower': '1/128',
		'spec.syncSpeedS': '1/250',
		notes: '',
		...overrides
	};
}

async function freshFlash(name = 'Wren 24 pocket flash') {
	return createGear(studio.people.owner.user, {
		studioId: studio.studioId,
		kind: 'flash',
		name,
		spec: { guideNumberM: 24, lowestPower: 1 / 64, syncSpeedS: 1 / 200, calibrationOffsetStops: 0, mainsPowered: false },
		notes: ''
	});
}

async function gearRow(id: string) {
	const [row] = await db.select().from(gear).where(eq(gear.id, id));
	return row;
}

describe('adding gear', () => {
	it('puts the item on the studio’s shelf', async () => {
		const r = await postAction('/gear?/add', flashForm({ name: 'Heron 58 flash' }), studio.people.editor);
		expect(r).toMatchObject({ type: 'success', status: 200 });
		expect(r.data).toMatchObject({ action: 'add', kind: 'flash', added: 'Heron 58 flash' });
		const rows = await db.select().from(gear).where(eq(gear.name, 'Heron 58 flash'));
		expect(rows.map((g) => [g.studioId, g.spec.guideNumberM])).toEqual([[studio.studioId, 40]]);
	});

	it('puts what the gear schema refuses beside its input', async () => {
		const zeroGn = await postAction('/gear?/add', flashForm({ 'spec.guideNumberM': '0' }), studio.people.editor);
		expect(zeroGn).toMatchObject({ type: 'failure', status: 400 });
		expect(zeroGn.data.errors['spec.guideNumberM']).toMatch(/greater than 0|at least/);
		expect(zeroGn.data.values['spec.guideNumberM']).toBe('0');
		const longName = await postAction('/gear?/add', flashForm({ name: 'n'.repeat(201) }), studio.people.editor);
		expect(longName.data.errors).toEqual({ name: 'must be at most 200 characters' });
		const badStudio = await postAction('/gear?/add', flashForm({ studioId: 'not-a-studio' }), studio.people.editor);
		expect(badStudio.data.errors).toEqual({ studioId: 'must be a studio id' });
	});

	it('refuses a viewer with 403 and an outsider with 404', async () => {
		const viewer = await postAction('/gear?/add', flashForm({ name: 'Not on my shelf' }), studio.people.viewer);
		expect(viewer).toMatchObject({ type: 'error', status: 403 });
		const outsider = await postAction('/gear?/add', flashForm({ name: 'Not on my shelf' }), studio.people.none);
		expect(outsider).toMatchObject({ type: 'error', status: 404 });
		expect(outsider.error?.message).toBe('No such studio.');
		expect(await db.select().from(gear).where(eq(gear.name, 'Not on my shelf'))).toEqual([]);
	});
});

describe('editing and retiring gear', () => {
	it('saves the change and goes back to the shelf', async () => {
		const item = await freshFlash();
		const r = await postAction('/gear?/edit', flashForm({ id: item.id, name: 'Wren 24 (recalibrated)', 'spec.calibrationOffsetStops': '-0.3' }), studio.people.editor);
		expect(r.type).toBe('redirect');
		expect(r.location).toBe(`/gear?studio=${studio.studioId}&saved=${encodeURIComponent('Wren 24 (recalibrated)')}#flash`);
		const row = await gearRow(item.id);
		expect(row.name).toBe('Wren 24 (recalibrated)');
		expect(row.spec.calibrationOffsetStops).toBe(-0.3);
	});

	it('keeps a flash’s guide numbers by zoom through an edit, as the form shows them', async () => {
		const byZoom = [
			{ zoomMm: 24, guideNumberM: 28 },
			{ zoomMm: 35, guideNumberM: 40 }
		];
		const item = await createGear(studio.people.owner.user, {
			studioId: studio.studioId,
			kind: 'flash',
			name: 'Zoom head flash',
			spec: { guideNumberM: 40, lowestPower: 1 / 128, syncSpeedS: 1 / 250, calibrationOffsetStops: 0, zoomMm: 35, guideNumbersByZoom: byZoom, mainsPowered: false },
			notes: ''
		});
		const page = await (await fetch(`${baseUrl()}/gear?studio=${studio.studioId}&edit=${item.id}`, { headers: { cookie: studio.people.editor.cookie } })).text();
		expect(page).toContain('24 mm: 28, 35 mm: 40');
		const r = await postAction('/gear?/edit', flashForm({ id: item.id, name: 'Zoom head flash', 'spec.zoomMm': '35', 'spec.guideNumbersByZoom': '24 mm: 28, 35 mm: 40, 105 mm: 58' }), studio.people.editor);
		expect(r.type).toBe('redirect');
		expect((await gearRow(item.id)).spec.guideNumbersByZoom).toEqual([...byZoom, { zoomMm: 105, guideNumberM: 58 }]);
	});

	it('puts a refused spec beside its input and keeps the item', async () => {
		const item = await freshFlash();
		const r = await postAction('/gear?/edit', flashForm({ id: item.id, 'spec.lowestPower': '2' }), studio.people.editor);
		expect(r).toMatchObject({ type: 'failure', status: 400 });
		expect(r.data.errors['spec.lowestPower']).toMatch(/at most 1/);
		expect((await gearRow(item.id)).spec.lowestPower).toBe(1 / 64);
	});

	it('retires an item and puts it back', async () => {
		const item = await freshFlash('Retiring flash');
		const out = await postAction('/gear?/retire', { id: item.id, retired: '1' }, studio.people.editor);
		expect(out.data).toMatchObject({ action: 'retire', retiredName: 'Retiring flash', retired: true });
		expect((await gearRow(item.id)).retiredAt).not.toBeNull();
		const back = await postAction('/gear?/retire', { id: item.id, retired: '0' }, studio.people.editor);
		expect(back.data).toMatchObject({ retired: false });
		expect((await gearRow(item.id)).retiredAt).toBeNull();
	});

	it('refuses a viewer with 403 and an unknown or unseen item with 404, and changes nothing', async () => {
		const item = await freshFlash('Guarded flash');
		const attempts: [string, Record<string, string>][] = [
			['edit', flashForm({ id: item.id, name: 'Taken over' })],
			['retire', { id: item.id, retired: '1' }]
		];
		for (const [action, form] of attempts) {
			expect(await postAction(`/gear?/${action}`, form, studio.people.viewer), action).toMatchObject({ type: 'error', status: 403 });
			expect(await postAction(`/gear?/${action}`, form, studio.people.none), action).toMatchObject({ type: 'error', status: 404 });
			const unknown = await postAction(`/gear?/${action}`, { ...form, id: '00000000-0000-4000-8000-000000000000' }, studio.people.editor);
			expect(unknown, action).toMatchObject({ type: 'error', status: 404 });
			expect(unknown.error?.message).toBe('No such gear.');
		}
		const row = await gearRow(item.id);
		expect(row).toMatchObject({ name: 'Guarded flash', retiredAt: null });
	});

	it('shows the shelf to a member, and an outsider only their own shelf', async () => {
		await freshFlash('Shelf page flash');
		const page = (cookie: string) => fetch(`${baseUrl()}/gear?studio=${studio.studioId}`, { headers: { cookie } });
		expect(await (await page(studio.people.viewer.cookie)).text()).toContain('Shelf page flash');
		// An outsider asking for this studio gets their own shelf: the page never shows another's gear.
		expect(await (await page(studio.people.none.cookie)).text()).not.toContain('Shelf page flash');
	});
});
