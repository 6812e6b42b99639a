// The gear shelf's rules: authz first, then the named queries; every spec checked against its kind.
import { error } from '@sveltejs/kit';
import { authorizeGear, authorizeStudio, can, GEAR_NOT_FOUND, requireUser, studioFilter, type StudioAccess } from '$lib/server/authz';
import type { SessionUser } from '$lib/server/session';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { insertGearRow, listGearOptions, listGearRows, updateGearRow, type GearOption, type TypedCalibration } from '$lib/server/db/queries/gear';
import type { Gear } from '$lib/server/db/schema';
import { parseGearSpec, type GearCreateInput, type GearKind, type GearUpdateInput } from '$lib/scene/gear';
import { InputError } from '$lib/server/setups-documents';

export interface GearItem {
	id: string;
	studioId: string;
	kind: GearKind;
	name: string;
	spec: Record<string, unknown>;
	notes: string;
	createdAt: string;
	updatedAt: string;
	retiredAt: string | null;
}

function gearItem(row: Gear): GearItem {
	return {
		id: row.id,
		studioId: row.studioId,
		kind: row.kind,
		name: row.name,
		spec: row.spec,
		notes: row.notes,
		createdAt: row.createdAt.toISOString(),
		updatedAt: row.updatedAt.toISOString(),
		retiredAt: row.retiredAt?.toISOString() ?? null
	};
}

async function studioOrPersonal(user: SessionUser, studioId: string | undefined) {
	if (studioId) return studioId;
	const studio = await ensurePersonalStudio(user.id, user.name || user.email.split('@')[0] || 'My');
	return studio.id;
}

/** The shelf of a studio (the caller's personal studio by default), retired gear only when asked. */
export async function listGear(
	user: SessionUser | null,
	options: { studioId?: string; kind?: GearKind; includeRetired?: boolean } = {}
): Promise<{ studioId: string; canEdit: boolean; items: GearItem[] }> {
	const signedIn = requireUser(user);
	const studioId = await studioOrPersonal(signedIn, options.studioId);
	const access = await authorizeStudio(signedIn, studioId, 'gear.view');
	return { studioId, canEdit: can(access, 'gear.edit'), items: await shelfOf(access, options) };
}

/**
 * The shelf of a studio whose access authz has already answered (the setup page has it from
 * `setupOverview`), so the page asks no second time; empty when the role may not see gear.
 */
export async function shelfOf(access: StudioAccess, options: { kind?: GearKind; includeRetired?: boolean } = {}): Promise<GearItem[]> {
	if (!can(access, 'gear.view')) return [];
	return (await listGearRows(access.studioId, options)).map(gearItem);
}

/** The gear on several shelves by name, for choosing one (the notebook's gear filter), leaving out any shelf the caller may not see. */
export async function listGearOnShelves(user: SessionUser | null, studioIds: string[]): Promise<GearOption[]> {
	return listGearOptions(studioIds, studioFilter(requireUser(user), 'gear.view'));
}

export async function getGear(user: SessionUser | null, gearId: string): Promise<GearItem & { canEdit: boolean }> {
	const { row, canEdit } = await authorizeGear(user, gearId, 'gear.view');
	return { ...gearItem(row), canEdit };
}

export async function createGear(user: SessionUser | null, input: GearCreateInput): Promise<GearItem> {
	const signedIn = requireUser(user);
	const studioId = await studioOrPersonal(signedIn, input.studioId);
	await authorizeStudio(signedIn, studioId, 'gear.edit');
	const row = await insertGearRow(
		{ studioId, kind: input.kind, name: input.name, spec: input.spec, notes: input.notes, createdById: signedIn.id },
		typedCalibration(input.kind, null, input.spec, signedIn.id)
	);
	return gearItem(row);
}

/**
 * A flash's calibration typed on the gear form, to keep in its history (`$lib/server/calibrations.ts`),
 * when it differs from the one in force; undefined when there is nothing to record.
 */
function typedCalibration(kind: string, before: Record<string, unknown> | null, spec: Record<string, unknown>, createdById: string): TypedCalibration | undefined {
	if (kind !== 'flash') return undefined;
	const offsetStops = Number(spec.calibrationOffsetStops ?? 0);
	if (offsetStops === Number(before?.calibrationOffsetStops ?? 0)) return undefined;
	return { offsetStops, ratedGuideNumberM: Number(spec.guideNumberM), createdById };
}

/** Changes name, spec, notes, or retires / returns an item. Setups keep the copies they already hold. */
export async function updateGear(user: SessionUser | null, gearId: string, input: GearUpdateInput): Promise<GearItem> {
	const { row } = await authorizeGear(user, gearId, 'gear.edit');
	let spec: Record<string, unknown> | undefined;
	if (input.spec !== undefined) {
		const parsed = parseGearSpec(row.kind, input.spec);
		if (!parsed.ok) throw new InputError(`Invalid input. ${parsed.issues[0].path.join('.')}: ${parsed.issues[0].message}`, parsed.issues);
		spec = parsed.spec;
	}
	const updated = await updateGearRow(
		row.id,
		{ name: input.name, spec, notes: input.notes, retired: input.retired },
		spec && typedCalibration(row.kind, row.spec, spec, requireUser(user).id)
	);
	if (!updated) error(404, GEAR_NOT_FOUND);
	return gearItem(updated);
}
