import { error } from '@sveltejs/kit';
import { requireUser } from '$lib/server/authz';
import { type RevisionRecord, type RevisionSummary, type SetupRecord } from '$lib/notebook/api';
import { compareDocuments, comparisonSentences } from '$lib/notebook/compare';
import { getOrFail } from '$lib/notebook/load';

function revisionParam(url: URL, name: string): number | null {
	const raw = url.searchParams.get(name);
	if (raw === null || raw === '') return null;
	if (!/^\d{1,9}$/.test(raw) || Number(raw) < 1) error(400, `${name} must be a revision number (1, 2, 3 …).`);
	return Number(raw);
}

export async function load({ params, fetch, url, locals }) {
	const user = requireUser(locals.user, url);
	const id = encodeURIComponent(params.id);
	const [setup, revisions] = await Promise.all([
		getOrFail<SetupRecord>(fetch, `/api/v1/setups/${id}`, url),
		getOrFail<RevisionSummary[]>(fetch, `/api/v1/setups/${id}/revisions`, url)
	]);
	const latest = setup.revisionNumber;
	const to = revisionParam(url, 'to') ?? latest;
	const from = revisionParam(url, 'from') ?? Math.max(1, to - 1);
	const [a, b] = await Promise.all([
		getOrFail<RevisionRecord>(fetch, `/api/v1/setups/${id}/revisions/${from}`, url),
		getOrFail<RevisionRecord>(fetch, `/api/v1/setups/${id}/revisions/${to}`, url)
	]);
	const comparison = compareDocuments(a.document, b.document, { unitSystem: user.unitSystem });
	const meta = (r: RevisionRecord) => ({
		number: r.number,
		authorName: r.authorName ?? null,
		createdAt: r.createdAt ?? '',
		message: r.message ?? '',
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
