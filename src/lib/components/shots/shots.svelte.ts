// The Shots section's client state: the setup's shots, sessions, checklist and flashes, read from the
// shots API, and uploads in flight (XMLHttpRequest, for upload progress and cancel).
import { callApi } from '$lib/notebook/api';

export interface ShotItem {
	id: string;
	fileName: string;
	revisionNumber: number;
	sessionId: string | null;
	createdAt: string;
	widthPx: number;
	heightPx: number;
	exif: { flashFired: boolean | null; flashMode: string | null; takenAt: string | null; cameraModel: string | null; lensModel: string | null; rejected: { field: string; reason: string }[] };
	settings: { fNumber: number | null; exposureTimeS: number | null; iso: number | null; focalLengthMm: number | null; sources: Record<string, string> };
	typed: Record<string, number>;
	images: { original: string; preview: string; thumbnail: string };
	predicted: { offsetStops: number | null; reason?: string };
	actual: { offsetStops: number; method: 'region' | 'meter' } | null;
	differenceStops: number | null;
}
export interface SessionItem {
	id: string;
	shotOn: string;
	note: string;
	ticks: { item: string }[];
	shotCount: number;
	meanDifferenceStops: number | null;
}
export interface Upload {
	key: number;
	name: string;
	loaded: number;
	total: number;
	state: 'sending' | 'done' | 'failed' | 'cancelled';
	message: string;
	xhr: XMLHttpRequest | null;
}

let uploadKey = 0;

export class ShotsState {
	shots = $state.raw<ShotItem[]>([]);
	sessions = $state.raw<SessionItem[]>([]);
	checklist = $state.raw<string[]>([]);
	flashes = $state.raw<{ id: string; name: string }[]>([]);
	meanDifferenceStops = $state<number | null>(null);
	uploads = $state<Upload[]>([]);
	error = $state<string | null>(null);
	loaded = $state(false);
	#base: string;

	constructor(
		readonly setupId: string,
		readonly studioId: string
	) {
		this.#base = `/api/v1/setups/${setupId}/shots`;
	}

	async refresh() {
		const list = await callApi<{ shots: ShotItem[]; sessions: SessionItem[]; meanDifferenceStops: number | null }>(fetch, this.#base);
		if (!list.ok) {
			this.error = list.message;
			return;
		}
		this.shots = list.data.shots;
		this.sessions = list.data.sessions;
		this.meanDifferenceStops = list.data.meanDifferenceStops;
		const checklist = await callApi<{ items: string[] }>(fetch, `${this.#base}/checklist`);
		if (checklist.ok) this.checklist = checklist.data.items;
		const gear = await callApi<{ items: { id: string; name: string }[] }>(fetch, `/api/v1/gear?studio=${this.studioId}&kind=flash`);
		if (gear.ok) this.flashes = gear.data.items;
		this.loaded = true;
	}

	/** One request per file, so each has its own progress bar and cancel. */
	upload(files: FileList | File[], sessionId: string | null) {
		for (const file of files) {
			const entry: Upload = { key: ++uploadKey, name: file.name, loaded: 0, total: file.size, state: 'sending', message: '', xhr: null };
			this.uploads = [...this.uploads, entry];
			const item = this.uploads[this.uploads.length - 1];
			const xhr = new XMLHttpRequest();
			item.xhr = xhr;
			const form = new FormData();
			form.append('files', file, file.name);
			if (sessionId) form.append('sessionId', sessionId);
			xhr.upload.onprogress = (e) => {
				item.loaded = e.loaded;
				if (e.lengthComputable) item.total = e.total;
			};
			xhr.onload = () => {
				let body: { failed?: { message: string }[]; error?: { message: string } } = {};
				try {
					body = JSON.parse(xhr.responseText);
				} catch {
					/* not JSON: the status says enough */
				}
				const failed = body.failed?.[0]?.message ?? body.error?.message;
				item.state = xhr.status === 201 ? 'done' : 'failed';
				item.message = xhr.status === 201 ? 'Stored' : (failed ?? `The server answered ${xhr.status}.`);
				void this.refresh();
			};
			xhr.onerror = () => {
				item.state = 'failed';
				item.message = `${file.name}: the connection was lost; nothing was stored.`;
			};
			xhr.onabort = () => {
				item.state = 'cancelled';
				item.message = 'Cancelled';
			};
			xhr.open('POST', this.#base);
			xhr.setRequestHeader('accept', 'application/json');
			xhr.send(form);
		}
	}

	cancel(upload: Upload) {
		upload.xhr?.abort();
	}

	async measure(shotId: string, region: { x: number; y: number; width: number; height: number }) {
		return this.#write(`${this.#base}/${shotId}/measure`, 'POST', { method: 'region', region });
	}

	async meter(shotId: string, aperture: number) {
		return this.#write(`${this.#base}/${shotId}/measure`, 'POST', { method: 'meter', meter: { aperture } });
	}

	async type(shotId: string, typed: Record<string, number | null>) {
		return this.#write(`${this.#base}/${shotId}`, 'PATCH', { typed });
	}

	async trash(shotId: string) {
		return this.#write(`${this.#base}/${shotId}`, 'DELETE');
	}

	async calibrate(shotId: string, gearId: string) {
		const r = await callApi<{ calibration: { guideNumberM: number; offsetStops: number; id: string }; warnings: string[] }>(fetch, `${this.#base}/calibrate`, {
			method: 'POST',
			body: { method: 'shot', gearId, shotId }
		});
		if (!r.ok) this.error = r.message;
		return r.ok ? r.data : null;
	}

	async undoCalibration(gearId: string, calibrationId: string) {
		return this.#write(`/api/v1/gear/${gearId}/calibrations/${calibrationId}/undo`, 'POST');
	}

	async newSession(shotOn: string, note: string) {
		return this.#write(`${this.#base}/sessions`, 'POST', { shotOn, note });
	}

	async tick(session: SessionItem, item: string, ticked: boolean) {
		const items = new Set(session.ticks.map((t) => t.item));
		if (ticked) items.add(item);
		else items.delete(item);
		return this.#write(`${this.#base}/sessions/${session.id}`, 'PATCH', { ticks: [...items] });
	}

	async saveChecklist(items: string[]) {
		return this.#write(`${this.#base}/checklist`, 'PUT', { items });
	}

	async #write(path: string, method: string, body?: unknown) {
		const r = await callApi(fetch, path, { method, body });
		this.error = r.ok ? null : r.message;
		await this.refresh();
		return r.ok;
	}
}

export const formatStops = (s: number | null) => (s === null ? '—' : `${s >= 0 ? '+' : '−'}${Math.abs(s).toFixed(1)}`);
export const formatShutter = (t: number | null) => (t === null ? null : t >= 1 ? `${t} s` : `1/${Math.round(1 / t)} s`);
