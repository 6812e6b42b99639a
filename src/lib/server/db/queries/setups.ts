// Named queries for setups and their revisions. Callers have asked authz first (src/lib/server/setups.ts).
import { and, asc, count, desc, eq, inArray, isNotNull, isNull, sql, type SQL } from 'drizzle-orm';
import { alias, type PgColumn } from 'drizzle-orm/pg-core';
import { db, type Tx } from '../index';
import { setupRevisions, setups, studioSetupCounts, studios, users } from '../schema';
import type { SetupListQuery } from '$lib/scene/inputs';
import { inStudiosOf, type StudioFilter } from './visibility';

type Runner = typeof db | Tx;

export interface SetupListFilter extends Pick<SetupListQuery, 'q' | 'tag' | 'subject' | 'sort' | 'order' | 'page' | 'pageSize'> {
	/** The studios to list from: named ones (asked of authz), or those a caller may see ('all' for a site admin). */
	studioIds: string[] | StudioFilter;
	gearId?: string;
	/** List the trash instead of the live setups. */
	trashed?: boolean;
}

/** `%`, `_` and `\` match literally in a search. */
function likePattern(word: string) {
	return `%${word.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** Words of a search; each must appear somewhere in title, subject, tags or gear names. */
export function searchWords(q: string | undefined): string[] {
	if (!q) return [];
	return [...new Set(q.toLowerCase().split(/\s+/).filter(Boolean))].slice(0, 8);
}

/**
 * Named studios were checked by authz, which sees only studios that are not deleted, and a caller's
 * filter keeps only live studios; with 'all' (a site admin) deleted studios are left out here, which
 * needs the join to studios.
 */
function listConditions(filter: SetupListFilter): SQL[] {
	const where: SQL[] = [filter.trashed ? isNotNull(setups.deletedAt) : isNull(setups.deletedAt)];
	if (filter.studioIds === 'all') where.push(isNull(studios.deletedAt));
	else where.push(studiosCondition(setups.studioId, filter.studioIds)!);
	for (const word of searchWords(filter.q)) where.push(sql`${setups.searchText} like ${likePattern(word)}`);
	if (filter.tag) where.push(sql`${setups.tags} @> array[${filter.tag}]::text[]`);
	if (filter.subject) where.push(sql`${setups.subject} ilike ${likePattern(filter.subject)}`);
	if (filter.gearId) where.push(sql`${setups.gearIds} @> array[${filter.gearId}]::uuid[]`);
	return where;
}

function studiosCondition(studioId: PgColumn, studioIds: string[] | StudioFilter) {
	return Array.isArray(studioIds) ? inArray(studioId, studioIds) : inStudiosOf(studioId, studioIds);
}

function listOrder(filter: SetupListFilter) {
	if (filter.trashed) return [desc(setups.deletedAt), desc(setups.id)];
	const dir = filter.order ?? (filter.sort === 'title' || filter.sort === 'subject' ? 'asc' : 'desc');
	const by = { updated: setups.updatedAt, created: setups.createdAt, title: setups.title, subject: setups.subject }[filter.sort];
	return dir === 'asc' ? [asc(by), asc(setups.id)] : [desc(by), desc(setups.id)];
}

const deletedBy = alias(users, 'deleted_by');

/** One page of setups and the total that match. The page walks the list index with a limit; a page that
 * is not full tells the total itself, and only otherwise is it asked of countSetups. */
export async function listSetups(filter: SetupListFilter) {
	if (Array.isArray(filter.studioIds) && filter.studioIds.length === 0) return { items: [], total: 0 };
	const where = and(...listConditions(filter));
	const offset = (filter.page - 1) * filter.pageSize;
	const items = await db
		.select({
			id: setups.id,
			title: setups.title,
			subject: setups.subject,
			tags: setups.tags,
			studioId: setups.studioId,
			studioName: studios.name,
			createdAt: setups.createdAt,
			updatedAt: setups.updatedAt,
			revisionNumber: setups.latestRevision,
			derivedFromSetupId: setups.derivedFromSetupId,
			derivedFromRevision: setups.derivedFromRevision,
			thumbnailRevision: setups.thumbnailRevision,
			gearIds: setups.gearIds,
			deletedAt: setups.deletedAt,
			deletedByName: sql<string | null>`coalesce(${deletedBy.name}, ${deletedBy.email})`
		})
		.from(setups)
		.innerJoin(studios, eq(studios.id, setups.studioId))
		.leftJoin(deletedBy, eq(deletedBy.id, setups.deletedById))
		.where(where)
		.orderBy(...listOrder(filter))
		.limit(filter.pageSize)
		.offset(offset);
	const pageTellsTotal = items.length > 0 ? items.length < filter.pageSize : offset === 0;
	return { items, total: pageTellsTotal ? offset + items.length : await countSetups(filter, where) };
}

/**
 * The total for a list. A whole studio's total (no search or filter) is read from studio_setup_counts,
 * which triggers keep, so it costs the same for ten setups or ten thousand; a filtered list is counted.
 */
async function countSetups(filter: SetupListFilter, where: SQL | undefined): Promise<number> {
	const filtered = searchWords(filter.q).length > 0 || !!filter.tag || !!filter.subject || !!filter.gearId;
	if (!filtered && filter.studioIds !== 'all') {
		const column = filter.trashed ? studioSetupCounts.trashed : studioSetupCounts.live;
		const [row] = await db
			.select({ n: sql<number>`coalesce(sum(${column}), 0)::int` })
			.from(studioSetupCounts)
			.where(studiosCondition(studioSetupCounts.studioId, filter.studioIds));
		return row.n;
	}
	const counted = db.select({ n: count() }).from(setups);
	const [row] = await (filter.studioIds === 'all' ? counted.innerJoin(studios, eq(studios.id, setups.studioId)) : counted).where(where);
	return row.n;
}

export type SetupListRow = Awaited<ReturnType<typeof listSetups>>['items'][number];

/** A setup row with its studio's name; trashed setups only when asked. */
export async function findSetup(id: string, { includeTrashed = false } = {}, run: Runner = db) {
	const [row] = await run
		.select({ setup: setups, studioName: studios.name })
		.from(setups)
		.innerJoin(studios, eq(studios.id, setups.studioId))
		.where(and(eq(setups.id, id), isNull(studios.deletedAt), includeTrashed ? undefined : isNull(setups.deletedAt)));
	return row ?? null;
}

export async function findRevision(setupId: string, number: number) {
	const [row] = await db
		.select({
			revision: setupRevisions,
			authorName: sql<string | null>`coalesce(${users.name}, ${users.email})`
		})
		.from(setupRevisions)
		.leftJoin(users, eq(users.id, setupRevisions.authorId))
		.where(and(eq(setupRevisions.setupId, setupId), eq(setupRevisions.number, number)));
	return row ?? null;
}

/** What a page shows of a revision: its document, who saved it, when and why; not the thumbnail. */
export async function findRevisionDocument(setupId: string, number: number) {
	const [row] = await db
		.select({
			document: setupRevisions.document,
			createdAt: setupRevisions.createdAt,
			message: setupRevisions.message,
			authorName: sql<string | null>`coalesce(${users.name}, ${users.email})`
		})
		.from(setupRevisions)
		.leftJoin(users, eq(users.id, setupRevisions.authorId))
		.where(and(eq(setupRevisions.setupId, setupId), eq(setupRevisions.number, number)));
	return row ?? null;
}

/** Every revision of a setup, newest first, without documents or thumbnails. */
export async function listRevisions(setupId: string) {
	return db
		.select({
			number: setupRevisions.number,
			parentNumber: setupRevisions.parentNumber,
			restoredFromNumber: setupRevisions.restoredFromNumber,
			authorId: setupRevisions.authorId,
			authorName: sql<string | null>`coalesce(${users.name}, ${users.email})`,
			createdAt: setupRevisions.createdAt,
			message: setupRevisions.message,
			title: setupRevisions.title,
			hasThumbnail: sql<boolean>`${setupRevisions.thumbnailPng} is not null`
		})
		.from(setupRevisions)
		.leftJoin(users, eq(users.id, setupRevisions.authorId))
		.where(eq(setupRevisions.setupId, setupId))
		.orderBy(desc(setupRevisions.number));
}

export async function revisionThumbnail(setupId: string, number: number) {
	const [row] = await db
		.select({ png: setupRevisions.thumbnailPng })
		.from(setupRevisions)
		.where(and(eq(setupRevisions.setupId, setupId), eq(setupRevisions.number, number)));
	return row?.png ?? null;
}

/** Live setups duplicated from this one, in the studios the filter lets through. */
export async function listDerivatives(setupId: string, visible: StudioFilter) {
	return db
		.select({
			id: setups.id,
			title: setups.title,
			subject: setups.subject,
			studioId: setups.studioId,
			revisionNumber: setups.derivedFromRevision
		})
		.from(setups)
		.innerJoin(studios, eq(studios.id, setups.studioId))
		.where(and(eq(setups.derivedFromSetupId, setupId), isNull(setups.deletedAt), isNull(studios.deletedAt), inStudiosOf(setups.studioId, visible)))
		.orderBy(asc(setups.createdAt), asc(setups.id));
}

/** The title of a live setup in a studio the filter lets through, or null. */
export async function visibleSetupTitle(setupId: string, visible: StudioFilter): Promise<string | null> {
	const [row] = await db
		.select({ title: setups.title })
		.from(setups)
		.innerJoin(studios, eq(studios.id, setups.studioId))
		.where(and(eq(setups.id, setupId), isNull(setups.deletedAt), isNull(studios.deletedAt), inStudiosOf(setups.studioId, visible)));
	return row?.title ?? null;
}

export interface RevisionContent {
	document: unknown;
	title: string;
	subject: string;
	tags: string[];
	gearIds: string[];
	searchText: string;
	message: string;
	authorId: string;
	thumbnailPng?: Uint8Array | null;
}

/** A new setup and its revision 1, in one transaction. */
export async function insertSetup(
	values: RevisionContent & {
		studioId: string;
		derivedFromSetupId?: string | null;
		derivedFromRevision?: number | null;
	},
	run?: Tx
) {
	const work = async (tx: Tx) => {
		const [setup] = await tx
			.insert(setups)
			.values({
				studioId: values.studioId,
				title: values.title,
				subject: values.subject,
				tags: values.tags,
				latestRevision: 1,
				derivedFromSetupId: values.derivedFromSetupId ?? null,
				derivedFromRevision: values.derivedFromRevision ?? null,
				gearIds: values.gearIds,
				searchText: values.searchText,
				thumbnailRevision: values.thumbnailPng ? 1 : null,
				createdById: values.authorId
			})
			.returning({ id: setups.id });
		await tx.insert(setupRevisions).values({
			setupId: setup.id,
			number: 1,
			parentNumber: null,
			document: values.document,
			title: values.title,
			subject: values.subject,
			tags: values.tags,
			authorId: values.authorId,
			message: values.message,
			thumbnailPng: values.thumbnailPng ?? null
		});
		return { id: setup.id, revisionNumber: 1 };
	};
	return run ? work(run) : db.transaction(work);
}

export type AppendOutcome =
	| { outcome: 'saved'; revisionNumber: number }
	| { outcome: 'stale'; latestRevision: number }
	| { outcome: 'missing' };

/**
 * Adds the next revision. The setup row's `latest_revision` moves forward with one conditional UPDATE:
 * concurrent saves on the same base queue on the row lock, and after the first commits the others'
 * condition (`latest_revision = base`) no longer holds, so they update nothing and are told the new
 * latest. The revision insert runs in the same transaction; (setup_id, number) is unique besides.
 * Without `baseRevision` (a restore that did not give one) it appends after whatever is latest.
 */
export async function appendRevision(
	setupId: string,
	baseRevision: number | null,
	content: RevisionContent & { restoredFromNumber?: number | null }
): Promise<AppendOutcome> {
	return db.transaction(async (tx) => {
		const [bumped] = await tx
			.update(setups)
			.set({
				latestRevision: sql`${setups.latestRevision} + 1`,
				updatedAt: sql`now()`,
				title: content.title,
				subject: content.subject,
				tags: content.tags,
				gearIds: content.gearIds,
				searchText: content.searchText,
				...(content.thumbnailPng ? { thumbnailRevision: sql`${setups.latestRevision} + 1` } : {})
			})
			.where(
				and(
					eq(setups.id, setupId),
					isNull(setups.deletedAt),
					baseRevision === null ? undefined : eq(setups.latestRevision, baseRevision)
				)
			)
			.returning({ number: setups.latestRevision });
		if (!bumped) {
			const [now] = await tx
				.select({ latest: setups.latestRevision })
				.from(setups)
				.where(and(eq(setups.id, setupId), isNull(setups.deletedAt)));
			return now ? { outcome: 'stale', latestRevision: now.latest } : { outcome: 'missing' };
		}
		await tx.insert(setupRevisions).values({
			setupId,
			number: bumped.number,
			parentNumber: bumped.number - 1,
			restoredFromNumber: content.restoredFromNumber ?? null,
			document: content.document,
			title: content.title,
			subject: content.subject,
			tags: content.tags,
			authorId: content.authorId,
			message: content.message,
			thumbnailPng: content.thumbnailPng ?? null
		});
		return { outcome: 'saved', revisionNumber: bumped.number };
	});
}

/** Moves a setup to its studio's trash; its revisions stay. */
export async function trashSetupRow(setupId: string, userId: string) {
	const rows = await db
		.update(setups)
		.set({ deletedAt: sql`now()`, deletedById: userId })
		.where(and(eq(setups.id, setupId), isNull(setups.deletedAt)))
		.returning({ id: setups.id });
	return rows.length > 0;
}

/** Takes a setup out of the trash, as it was. */
export async function untrashSetupRow(setupId: string) {
	const rows = await db
		.update(setups)
		.set({ deletedAt: null, deletedById: null, updatedAt: sql`now()` })
		.where(and(eq(setups.id, setupId), isNotNull(setups.deletedAt)))
		.returning({ id: setups.id, revisionNumber: setups.latestRevision });
	return rows[0] ?? null;
}

export async function countRevisions(setupId: string) {
	const [row] = await db.select({ n: count() }).from(setupRevisions).where(eq(setupRevisions.setupId, setupId));
	return row.n;
}
