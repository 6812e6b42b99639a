// Setup files: a revision exported as a file anyone can keep or send, and a setup made from one.
import { authorizeSetup, authorizeStudio, requireUser } from '$lib/server/authz';
import type { SessionUser } from '$lib/server/session';
import { buildSetupExport, exportFileName, parseSetupExport, type SetupExport } from '$lib/scene/export';
import { InputError, readStoredDocument } from '$lib/server/setups-documents';
import { createSetup, loadRevision, personalStudioId } from '$lib/server/setups';

export async function exportSetup(
	user: SessionUser | null,
	setupId: string,
	number?: number
): Promise<{ file: SetupExport; fileName: string }> {
	const { setup, studioName } = await authorizeSetup(user, setupId, 'setups.view');
	const revisionNumber = number ?? setup.latestRevision;
	const { revision } = await loadRevision(setup, revisionNumber);
	const read = readStoredDocument(revision.document);
	const file = buildSetupExport({
		title: revision.title,
		subject: revision.subject,
		tags: revision.tags,
		document: read.document,
		source: { setupId: setup.id, revisionNumber, studioName }
	});
	return { file, fileName: exportFileName(revision.title, revisionNumber) };
}

/** A setup made from an export file's text. A bad file creates nothing and says what is wrong. */
export async function importSetup(
	user: SessionUser | null,
	text: string,
	options: { studioId?: string } = {}
): Promise<{ id: string; revisionNumber: 1 }> {
	const signedIn = requireUser(user);
	const studioId = options.studioId ?? (await personalStudioId(signedIn));
	await authorizeStudio(signedIn, studioId, 'setups.edit');
	const parsed = parseSetupExport(text);
	if (!parsed.ok) throw new InputError(parsed.message, parsed.issues);
	const file = parsed.value;
	return createSetup(signedIn, {
		studioId,
		title: file.title,
		subject: file.subject,
		tags: file.tags,
		document: file.document,
		message: `Imported from a file exported ${file.exportedAt.slice(0, 10)}`
	});
}

/** The download of a setup file, for the API and the setup page alike. */
export function setupFileResponse({ file, fileName }: { file: SetupExport; fileName: string }): Response {
	return new Response(JSON.stringify(file, null, '\t') + '\n', {
		headers: {
			'content-type': 'application/json; charset=utf-8',
			'content-disposition': `attachment; filename="${fileName}"`,
			'cache-control': 'no-store'
		}
	});
}
