import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { getSetup, getSetupRevision, listSetupRevisions, type RevisionDetail } from '$lib/server/setups';
import { compareDocuments, comparisonSentences } from '$lib/notebook/compare';

function revisionParam(url: URL, name: string): number | null {
	const raw = url.searchParams.get(name);
	if (raw === null || raw === '') return null;
	if (!/^\d{1,9}$/.test(raw) || Number(raw) < 1) error(400, `${name} must be a revision number (1, 2, 3 …).`);
	return Number(raw);
}

export async function load({ params, url, locals }) {
	const user = requireUser(locals.user, url);
	const [setup, revisions] = await Promise.all([getSetup(user, params.id), listSetupRevisions(user, params.id)]);
	const to = revisionParam(url, 'to') ?? setup.revisionNumber;
	const from = revisionParam(url, 'from') ?? Math.max(1, to - 1);
	const [a, b] = await Promise.all([getSetupRevision(user, params.id, from), getSetupRevision(user, params.id, to)]);
	const comparison = compareDocuments(a.document, b.document, { unitSystem: user.unitSystem });
	const meta = (r: RevisionDetail) => ({
		number: r.number,
		authorName: r.authorName ?? null,
		createdAt: r.createdAt,
		message: r.message ?? '',
		restoredFrom: r.restoredFrom,
		hasThumbnail: r.hasThumbnail,
		aperture: r.document.scene.camera.aperture
	});
	return {
		setup: { id: setup.id, title: setup.title },
		revisionNumbers: revisions.map((r) => r.number),
		from: meta(a),
		to: meta(b),
		comparison,
		sentences: comparisonSentences(comparison)
	};
}
