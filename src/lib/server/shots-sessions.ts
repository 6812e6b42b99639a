// Shooting sessions of a setup (a date, a note, the ticked pre-shot checklist) and a studio's checklist.
import { error } from '@sveltejs/kit';
import { authorizeSetup } from '$lib/server/authz';
import { checklistOf, findSessionRow, insertSessionRow, saveChecklist, ticksOf, updateSessionRow } from '$lib/server/db/queries/shots';
import { RuleViolation } from '$lib/server/errors';
import type { SessionUser } from '$lib/server/session';
import { DEFAULT_CHECKLIST } from '$lib/shots/types';
import type { z } from 'zod';
import type { sessionCreateSchema, sessionUpdateSchema } from '$lib/shots/types';

export async function studioChecklist(studioId: string): Promise<string[]> {
	return (await checklistOf(studioId))?.items ?? [...DEFAULT_CHECKLIST];
}

/** The checklist of the setup's studio (the default list until the studio writes its own). */
export async function getChecklist(user: SessionUser | null, setupId: string) {
	const { access, canEdit } = await authorizeSetup(user, setupId, 'shots.view');
	return { studioId: access.studioId, items: await studioChecklist(access.studioId), canEdit };
}

/** Editors and owners may change their studio's list; sessions keep the ticks they had. */
export async function setChecklist(user: SessionUser | null, setupId: string, items: string[]) {
	const { access } = await authorizeSetup(user, setupId, 'shots.edit');
	const unique = [...new Set(items)];
	if (unique.length !== items.length) throw new RuleViolation('each item may be listed once', 'items');
	await saveChecklist(access.studioId, unique);
	return getChecklist(user, setupId);
}

export async function createSession(user: SessionUser | null, setupId: string, input: z.output<typeof sessionCreateSchema>) {
	await authorizeSetup(user, setupId, 'shots.edit');
	const row = await insertSessionRow({ setupId, shotOn: input.shotOn, note: input.note, createdById: user!.id });
	return { id: row.id, shotOn: row.shotOn, note: row.note, ticks: [] };
}

export async function updateSession(user: SessionUser | null, setupId: string, sessionId: string, input: z.output<typeof sessionUpdateSchema>) {
	const { access } = await authorizeSetup(user, setupId, 'shots.edit');
	const existing = /^[0-9a-f-]{36}$/i.test(sessionId) ? await findSessionRow(setupId, sessionId) : null;
	if (!existing) error(404, 'No such shooting session.');
	if (input.ticks) {
		const known = new Set(await studioChecklist(access.studioId));
		const unknown = input.ticks.find((t) => !known.has(t));
		if (unknown !== undefined) throw new RuleViolation(`"${unknown}" is not on the studio's checklist`, 'ticks');
	}
	const values: { shotOn?: string; note?: string } = {};
	if (input.shotOn !== undefined) values.shotOn = input.shotOn;
	if (input.note !== undefined) values.note = input.note;
	const row = await updateSessionRow(existing.id, values, input.ticks ? { items: [...new Set(input.ticks)], byId: user!.id } : null);
	const ticks = await ticksOf([row.id]);
	return { id: row.id, shotOn: row.shotOn, note: row.note, ticks: ticks.map((t) => ({ item: t.item, tickedAt: t.tickedAt.toISOString() })) };
}
