import { can, studioAccess } from '$lib/server/authz';
import { callApi, type SetupRecord } from '$lib/notebook/api';
import type { ExposureResult } from '$lib/light/scene';
import { getOrFail, requireSignedIn } from '$lib/notebook/load';

/** The plan editor of a setup: the setup as the API gives it (404/403 pass through), and the server's exposure for the saved revision. */
export async function load({ params, fetch, url, locals }) {
	const user = requireSignedIn(locals.user, url);
	const setup = await getOrFail<SetupRecord & { canEdit?: boolean }>(fetch, `/api/v1/setups/${encodeURIComponent(params.id)}`, url);
	const [exposure, access] = await Promise.all([
		callApi<ExposureResult>(fetch, `/api/v1/setups/${setup.id}/exposure`),
		studioAccess(user, setup.studioId)
	]);
	return {
		setup: { id: setup.id, title: setup.title, subject: setup.subject, revisionNumber: setup.revisionNumber },
		document: setup.document,
		exposure: exposure.ok ? exposure.data : null,
		canEdit: setup.canEdit ?? can(access, 'setups.edit'),
		unitSystem: user.unitSystem
	};
}
