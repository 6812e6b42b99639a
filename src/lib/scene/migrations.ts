/**
 * Numbered migrations of the setup document, applied on read: a revision saved under an older
 * `schemaVersion` is brought up to `CURRENT_SCHEMA_VERSION` step by step, then checked with
 * `setupDocumentSchema`. Stored revisions are never rewritten; the migration runs each time one is read.
 *
 * To change the document: bump CURRENT_SCHEMA_VERSION in version.ts, add a step here that turns a
 * version n document into version n + 1 (plain JSON in, plain JSON out), and add its test.
 */
import { CURRENT_SCHEMA_VERSION, setupDocumentSchema, type SetupDocument } from './document';

export interface DocumentIssue {
	path: string[];
	message: string;
}

export type MigrationResult =
	| { ok: true; document: SetupDocument; migratedFrom: number | null }
	| { ok: false; message: string; issues: DocumentIssue[] };

type Json = Record<string, unknown>;

/** A step found the old document in a shape it cannot migrate. */
export class MigrationError extends Error {
	constructor(
		message: string,
		readonly path: string[]
	) {
		super(message);
	}
}

interface Migration {
	from: number;
	describe: string;
	up(doc: Json): Json;
}

const isRecord = (v: unknown): v is Json => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Version 0 never shipped: it is an invented earlier shape, kept so the migration path is exercised from
 * the first release. In it, notes were an array of lines, the drawing lived under `layout` (keyed by
 * element id, with `angle`, `w`, `d`, `color`), and there were no gear copies.
 */
const v0ToV1: Migration = {
	from: 0,
	describe: 'notes from an array of lines to one Markdown string; layout to plan.elements',
	up(doc) {
		const { layout, notes, ...rest } = doc;
		let text = '';
		if (notes !== undefined) {
			if (!Array.isArray(notes) || notes.some((l) => typeof l !== 'string')) {
				throw new MigrationError('in a version 0 document, notes must be an array of lines', ['notes']);
			}
			text = (notes as string[]).join('\n');
		}
		const elements: Json = {};
		if (layout !== undefined) {
			if (!isRecord(layout)) throw new MigrationError('in a version 0 document, layout must be an object', ['layout']);
			for (const [id, raw] of Object.entries(layout)) {
				if (!isRecord(raw)) throw new MigrationError('must be an object', ['layout', id]);
				const { angle, w, d, color, ...more } = raw;
				elements[id] = {
					...more,
					...(angle !== undefined ? { rotationDeg: angle } : {}),
					...(w !== undefined ? { widthM: w } : {}),
					...(d !== undefined ? { depthM: d } : {}),
					...(color !== undefined ? { colour: color } : {})
				};
			}
		}
		return { ...rest, schemaVersion: 1, plan: Object.keys(elements).length ? { elements } : {}, notes: text, gear: [] };
	}
};

/**
 * Version 2: the ambient light (a window or open sky) is an element of the plan, `kind: "ambient"`, with
 * its place (`position`), the way the light travels (`rotationDeg`), its width and its `source`
 * ("window" or "sky"); its EV and kelvin stay in `scene.ambient`. A version 1 plan that draws
 * elements gets an entry for the scene's ambient, as open sky; the editor lays out where it goes. A
 * plan of `{}` stays `{}` (the editor lays out everything). The scene is not touched.
 */
const v1ToV2: Migration = {
	from: 1,
	describe: 'the scene’s ambient light gets a plan entry of its own (kind "ambient")',
	up(doc) {
		const next = { ...doc, schemaVersion: 2 };
		const { scene, plan } = doc;
		if (!isRecord(scene) || scene.ambient === undefined || !isRecord(plan) || !isRecord(plan.elements)) return next;
		const elements = plan.elements;
		if (!Object.keys(elements).length || Object.values(elements).some((e) => isRecord(e) && e.kind === 'ambient')) return next;
		// The id the editor gives an ambient light it lays out (AMBIENT_ID in src/lib/editor/model/layout.ts).
		let id = 'ambient-1';
		for (let n = 2; id in elements; n++) id = `ambient-${n}`;
		return { ...next, plan: { ...plan, elements: { ...elements, [id]: { kind: 'ambient', label: 'Ambient light', source: 'sky' } } } };
	}
};

const finiteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * Version 3: a flash's calibration is the scene light's `calibrationOffsetStops`, which the engine
 * applies, and the gear copy's `spec.calibrationOffsetStops` is the offset in force when the revision
 * was saved. Version 2 held it in two other ways: the editor multiplied the shelf's offset into the
 * guide number (rounded to 0.01 m), and a calibration from a shot or a meter was a `spec.calibration`
 * ({ guideNumberM, ratedGuideNumberM }) on the gear copy, applied when the exposure was computed. Both
 * move into the light's offset, so the guide number is the shelf's again and every prediction stays
 * exactly what it was: light ∝ GN², so a guide number scaled by k is 2·log2(k) stops.
 */
const v2ToV3: Migration = {
	from: 2,
	describe: 'a flash’s calibration moves out of its guide number and the gear copy into the light’s calibrationOffsetStops',
	up(doc) {
		const next = { ...doc, schemaVersion: 3 };
		const { scene, plan, gear } = doc;
		if (!isRecord(scene) || !Array.isArray(scene.lights) || !Array.isArray(gear)) return next;
		const elements = isRecord(plan) && isRecord(plan.elements) ? plan.elements : {};
		const copies = new Map(gear.filter((g): g is Json => isRecord(g) && g.kind === 'flash' && isRecord(g.spec)).map((g) => [g.id, g.spec as Json]));
		const measuredStops = (spec: Json) => {
			const c = spec.calibration;
			return isRecord(c) && finiteNumber(c.guideNumberM) && finiteNumber(c.ratedGuideNumberM) && c.guideNumberM > 0 && c.ratedGuideNumberM > 0
				? 2 * Math.log2(c.guideNumberM / c.ratedGuideNumberM)
				: 0;
		};
		const lights = scene.lights.map((light) => {
			if (!isRecord(light) || light.kind !== 'flash' || !finiteNumber(light.guideNumber)) return light;
			const entry = elements[String(light.id)];
			const spec = isRecord(entry) ? copies.get(entry.gearId) : undefined;
			if (!spec) return light;
			let guideNumber = light.guideNumber;
			let offset = finiteNumber(light.calibrationOffsetStops) ? light.calibrationOffsetStops : 0;
			const rated = spec.guideNumberM;
			const typed = finiteNumber(spec.calibrationOffsetStops) ? spec.calibrationOffsetStops : 0;
			if (typed !== 0 && finiteNumber(rated) && rated > 0 && guideNumber === Math.round(rated * 2 ** (typed / 2) * 100) / 100) {
				offset += 2 * Math.log2(guideNumber / rated);
				guideNumber = rated;
			}
			offset += measuredStops(spec);
			const { calibrationOffsetStops: _old, ...rest } = light;
			return { ...rest, guideNumber, ...(offset !== 0 ? { calibrationOffsetStops: offset } : {}) };
		});
		const copiesNow = gear.map((g) => {
			if (!isRecord(g) || !isRecord(g.spec) || !('calibration' in g.spec)) return g;
			const { calibration: _gone, ...spec } = g.spec;
			const typed = finiteNumber(spec.calibrationOffsetStops) ? spec.calibrationOffsetStops : 0;
			return { ...g, spec: { ...spec, calibrationOffsetStops: typed + measuredStops(g.spec) } };
		});
		return { ...next, scene: { ...scene, lights }, gear: copiesNow };
	}
};

/** In order; MIGRATIONS[i] takes version i to version i + 1. */
export const MIGRATIONS: readonly Migration[] = [v0ToV1, v1ToV2, v2ToV3];

if (MIGRATIONS.length !== CURRENT_SCHEMA_VERSION || MIGRATIONS.some((m, i) => m.from !== i)) {
	throw new Error('setup document migrations must run 0 → 1 → … → CURRENT_SCHEMA_VERSION without gaps');
}

/** Brings a stored or imported document of any known version up to date and validates it. */
export function migrateDocument(raw: unknown): MigrationResult {
	if (!isRecord(raw)) {
		return fail('The setup document must be a JSON object.', [[], 'expected an object with schemaVersion, scene, plan and notes']);
	}
	const version = raw.schemaVersion;
	if (version === undefined) return fail('The setup document has no schemaVersion.', [['schemaVersion'], 'is required']);
	if (typeof version !== 'number' || !Number.isInteger(version) || version < 0) {
		return fail('The setup document has an unknown schemaVersion.', [['schemaVersion'], 'must be a whole number from 0']);
	}
	if (version > CURRENT_SCHEMA_VERSION) {
		return fail(
			`The setup document was written by a newer version of Squarelaw (schemaVersion ${version}); this one reads up to ${CURRENT_SCHEMA_VERSION}.`,
			[['schemaVersion'], `must be at most ${CURRENT_SCHEMA_VERSION}`]
		);
	}
	let doc: Json = raw;
	try {
		for (let v = version; v < CURRENT_SCHEMA_VERSION; v++) doc = MIGRATIONS[v].up(doc);
	} catch (e) {
		if (e instanceof MigrationError) {
			return fail(`The version ${version} setup document cannot be migrated: ${e.path.join('.')} ${e.message}.`, [e.path, e.message]);
		}
		throw e;
	}
	const parsed = setupDocumentSchema.safeParse(doc);
	if (!parsed.success) {
		const issues = parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message }));
		const first = issues[0];
		return {
			ok: false,
			message: `The setup document is not valid: ${first.path.join('.') || 'document'} ${first.message}.`,
			issues
		};
	}
	return { ok: true, document: parsed.data, migratedFrom: version === CURRENT_SCHEMA_VERSION ? null : version };
}

function fail(message: string, [path, issue]: [string[], string]): MigrationResult {
	return { ok: false, message, issues: [{ path, message: issue }] };
}
