// The gear shelf's rules: authz first, then the named queries; every spec checked against its kind.
import { error } from '@sveltejs/kit';
import { authorizeStudio, can, isUuid, requireUser, studioAccess } from '$lib/server/authz';
import type { SessionUser } from '$lib/server/session';
import { ensurePersonalStudio } from '$lib/server/db/queries/studios';
import { findGearRow, insertGearRow, listGearRows, updateGearRow } from '$lib/server/db/queries/gear';
import type { Gear } from '$lib/server/db/schema';
import { parseGearSpec, type GearCreateInput, type GearKind, type GearUpdateInput } from '$lib/scene/gear';
import { InputError } from '$lib/server/setups';

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

const NOT_FOUND = 'No such gear.';

/** 401 anonymous; 404 unknown or in a studio the caller cannot see; 403 when the role lacks the capability. */
async function authorizeGear(user: SessionUser | null, gearId: string, capability: 'gear.view' | 'gear.edit') {
	const signedIn = requireUser(user);
	if (!isUuid(gearId)) error(404, NOT_FOUND);
	const row = await findGearRow(gearId);
	if (!row) error(404, NOT_FOUND);
	const access = await studioAccess(signedIn, row.studioId);
	if (!access || !can(access, 'gear.view')) error(404, NOT_FOUND);
	if (!can(access, capability)) error(403, `Your role in this studio does not allow that (${capability}).`);
	return { row, access };
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
	const rows = await listGearRows(studioId, options);
	return { studioId, canEdit: can(access, 'gear.edit'), items: rows.map(gearItem) };
}

export async function getGear(user: SessionUser | null, gearId: string): Promise<GearItem & { canEdit: boolean }> {
	const { row, access } = await authorizeGear(user, gearId, 'gear.view');
	return { ...gearItem(row), canEdit: can(access, 'gear.edit') };
}

export async function createGear(user: SessionUser | null, input: GearCreateInput): Promise<GearItem> {
	const signedIn = requireUser(user);
	const studioId = await studioOrPersonal(signedIn, input.studioId);
	await authorizeStudio(signedIn, studioId, 'gear.edit');
	const row = await insertGearRow({
		studioId,
		kind: input.kind,
		name: input.name,
		spec: input.spec,
		notes: input.notes,
		createdById: signedIn.id
	});
	return gearItem(row);
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
	const updated = await updateGearRow(row.id, { name: input.name, spec, notes: input.notes, retired: input.retired });
	if (!updated) error(404, NOT_FOUND);
	return gearItem(updated);
}
