// The demo notebook of the Fernhill Geology Circle (invented, see BRIEF.md): the setups of its
// catalogue and workshop, each with the revisions that got it right. Model names are
// invented; figures are realistic for small flashes and macro lenses but are demo data, not measurements.
// Plan coordinates: metres, the subject near the origin, x to the camera's right, y away from the
// camera, z up from the table top.
import type { GearSnapshot, Plan, SetupDocumentInput } from '$lib/scene/document';
import type { ExposureSceneInput } from '$lib/light/schema';
import { DEMO_GEAR, type DemoGear } from './demo-gear';
import { CURRENT_SCHEMA_VERSION } from '$lib/scene/version';

export { DEMO_GEAR, type DemoGear };

export const DEMO_SETUP_IDS = {
	quartz: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000001',
	ammonite: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000002',
	moss: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000003',
	amethyst: '3c0d6a41-8b2e-4d7f-a1c3-5e9f00000004'
};

export type DemoAuthor = 'mara' | 'tobias';

export interface DemoRevision {
	author: DemoAuthor;
	at: string;
	message: string;
	document: SetupDocumentInput;
}

export interface DemoSetup {
	id: string;
	title: string;
	subject: string;
	tags: string[];
	derivedFrom?: { setupId: string; revisionNumber: number };
	revisions: DemoRevision[];
}

function snapshot(g: DemoGear, at: string): GearSnapshot {
	return { id: g.id, kind: g.kind, name: g.name, spec: g.spec, copiedAt: at };
}

/**
 * A document whose gear copies are those the plan names, copied at `at`. The scene's camera stands where
 * the plan draws it, as a save from the editor puts it: the subject's face is then turned the way the
 * engine reads it (Lambert's cosine), and opening the setup in the editor changes none of its numbers.
 */
function doc(scene: ExposureSceneInput, plan: Plan, notes: string, at: string): SetupDocumentInput {
	const all = Object.values(DEMO_GEAR) as DemoGear[];
	const ids = new Set(Object.values(plan.elements ?? {}).map((e) => e.gearId).filter(Boolean));
	const cameraAt = plan.elements?.camera?.position;
	return {
		schemaVersion: CURRENT_SCHEMA_VERSION,
		scene: cameraAt ? { ...scene, camera: { ...scene.camera, position: cameraAt } } : scene,
		plan,
		notes,
		gear: all.filter((g) => ids.has(g.id)).map((g) => snapshot(g, at))
	};
}

const G = DEMO_GEAR;

// ---------- Quartz cluster on black velvet ----------
// The Corvid M2 (36 × 24 mm: d/1500 = 0.029 mm) with the Heron 100 mm macro (pupil magnification 0.6).
const corvidM2 = { cocMm: 0.029, syncSpeed: 1 / 200 };
const quartzCamera = (iso: number) => ({ iso, aperture: 16, shutter: 1 / 200, magnification: 0.4, pupilMagnification: 0.6, ...corvidM2, minAperture: 5.6, maxAperture: 32 });
/** The Kestrel 40 as the shelf holds it: GN 28 at its 35 mm zoom (its calibration comes from the shelf copy). */
const kestrelAt35 = { guideNumber: 28 };
/** The cluster lies on the velvet with its terminations up, toward the softbox above it: its face is taken as up. */
const quartzSubject = (z: number) => ({ position: [0, 0, z] as [number, number, number], facing: 'up' as const });
const quartzKey = (power: number) => ({
	id: 'key',
	kind: 'flash' as const,
	position: [-0.24, 0.18, 0.42] as [number, number, number],
	...kestrelAt35,
	power,
	lossStops: 1.7,
	aim: [0, 0, 0.04] as [number, number, number],
	beamAngleDeg: 90,
	kelvin: 5600
});
const quartzCard = (position: [number, number, number]) => ({
	id: 'card',
	kind: 'reflector' as const,
	position,
	areaM2: 0.06,
	reflectance: 0.85,
	surface: 'diffuse' as const,
	source: 'key'
});
const quartzPlan = (withCard: boolean): Plan => ({
	elements: {
		subject: { kind: 'subject', label: 'Quartz cluster', widthM: 0.09, depthM: 0.07, heightM: 0.08, colour: '#e8e4dc' },
		camera: { kind: 'camera', label: 'Corvid M2 + Heron 100 mm', position: [0, -0.42, 0.22], rotationDeg: 90, gearId: G.corvidM2.id },
		lens: { kind: 'label', label: 'Heron 100 mm macro', gearId: G.heron100.id, attachedTo: 'camera' },
		key: { kind: 'flash', label: 'Kestrel 40 in softbox', rotationDeg: -35, gearId: G.kestrel40.id },
		softbox: { kind: 'modifier', label: '30 cm softbox', widthM: 0.3, depthM: 0.3, attachedTo: 'key', gearId: G.softbox30.id },
		...(withCard ? { card: { kind: 'reflector', label: 'White card', widthM: 0.2, depthM: 0.01, rotationDeg: 160, colour: '#ffffff', gearId: G.whiteCard.id } } : {}),
		velvet: { kind: 'background', label: 'Black velvet', position: [0, 0.05, 0], widthM: 0.6, depthM: 0.5, colour: '#141414', locked: true }
	},
	viewport: { center: [0, 0], widthM: 1.2, depthM: 1 }
});
const quartzNotes = [
	'# Quartz cluster for the catalogue',
	'',
	'- Brush the velvet with a lint roller before every session; dust shows at f/16.',
	'- One flash in the 30 cm softbox, high at the upper left, aimed at the tips of the crystals.'
].join('\n');
const quartzNotesCard = `${quartzNotes}\n- White card opposite, standing on its edge, opens the shadow side of the cluster.`;
const quartzNotesFinal = `${quartzNotesCard}\n- Clean the crystals with a soft brush and a blower, never a cloth (fibres catch on the terminations).`;
const quartzNotesFlag = `${quartzNotesFinal}\n- A black flag between the softbox and the lens keeps the key off the front element: the exposure stays, the veiling flare goes.`;
/** A black card standing between the key and the lens, off every path of light to the subject and the card. */
const quartzFlag = { id: 'flag', from: [-0.2, -0.2] as [number, number], to: [-0.05, -0.3] as [number, number] };
const quartzPlanWithFlag = (): Plan => ({
	...quartzPlan(true),
	elements: { ...quartzPlan(true).elements, flag: { kind: 'flag', label: 'Black flag off the lens', colour: '#202020' } }
});

const quartz: DemoSetup = {
	id: DEMO_SETUP_IDS.quartz,
	title: 'Quartz cluster on black velvet',
	subject: 'Quartz cluster (FGC-0127)',
	tags: ['minerals', 'quartz', 'black velvet', 'catalogue'],
	revisions: [
		{
			author: 'mara',
			at: '2026-10-06T18:40:00Z',
			message: 'Softbox high at the upper left, 1/8 power',
			document: doc({ camera: quartzCamera(100), subject: quartzSubject(0.04), lights: [quartzKey(1 / 8)] }, quartzPlan(false), quartzNotes, '2026-10-06T18:40:00Z')
		},
		{
			author: 'mara',
			at: '2026-10-06T19:05:00Z',
			message: 'Up to 1/4 power and ISO 200: the first frames were two stops dark',
			document: doc({ camera: quartzCamera(200), subject: quartzSubject(0.04), lights: [quartzKey(1 / 4)] }, quartzPlan(false), quartzNotes, '2026-10-06T18:40:00Z')
		},
		{
			author: 'tobias',
			at: '2026-10-13T19:20:00Z',
			message: 'White card opposite to open up the shadow side',
			document: doc(
				{ camera: quartzCamera(200), subject: quartzSubject(0.04), lights: [quartzKey(1 / 4), quartzCard([0.22, -0.08, 0.1])] },
				quartzPlan(true),
				quartzNotesCard,
				'2026-10-06T18:40:00Z'
			)
		},
		{
			author: 'mara',
			at: '2026-10-20T18:55:00Z',
			message: 'Card 8 cm closer for a brighter fill; cleaning notes',
			document: doc(
				{ camera: quartzCamera(200), subject: quartzSubject(0.04), lights: [quartzKey(1 / 4), quartzCard([0.15, -0.05, 0.08])] },
				quartzPlan(true),
				quartzNotesFinal,
				'2026-10-06T18:40:00Z'
			)
		},
		{
			author: 'tobias',
			at: '2026-11-03T19:00:00Z',
			message: 'Black flag between the key and the lens: no flare at f/16',
			document: doc(
				{ camera: quartzCamera(200), subject: quartzSubject(0.04), lights: [quartzKey(1 / 4), quartzCard([0.15, -0.05, 0.08])], flags: [quartzFlag] },
				quartzPlanWithFlag(),
				quartzNotesFlag,
				'2026-10-06T18:40:00Z'
			)
		}
	]
};

// ---------- Amethyst geode, duplicated from the quartz cluster ----------
const amethyst: DemoSetup = {
	id: DEMO_SETUP_IDS.amethyst,
	title: 'Amethyst geode on black velvet',
	subject: 'Amethyst geode half (FGC-0412)',
	tags: ['minerals', 'amethyst', 'black velvet', 'catalogue'],
	derivedFrom: { setupId: DEMO_SETUP_IDS.quartz, revisionNumber: 4 },
	revisions: [
		{
			author: 'tobias',
			at: '2026-10-27T19:10:00Z',
			message: 'Duplicated from “Quartz cluster on black velvet”, revision 4, for Amethyst geode half (FGC-0412)',
			document: quartz.revisions[3].document
		},
		{
			author: 'tobias',
			at: '2026-10-27T19:35:00Z',
			message: 'The geode is darker than the quartz: flash up to 1/2, a third of a stop over the reading on purpose',
			document: doc(
				{ camera: quartzCamera(200), subject: quartzSubject(0.05), lights: [quartzKey(1 / 2), quartzCard([0.15, -0.05, 0.08])] },
				{
					...quartzPlan(true),
					elements: {
						...quartzPlan(true).elements,
						subject: { kind: 'subject', label: 'Amethyst geode half', widthM: 0.12, depthM: 0.1, heightM: 0.06, colour: '#7d5ba6' }
					}
				},
				`${quartzNotesFinal.replace('# Quartz cluster for the catalogue', '# Amethyst geode for the catalogue')}\n- Tilt the geode 10° towards the camera so the cavity fills the frame.`,
				'2026-10-06T18:40:00Z'
			)
		}
	]
};

// ---------- Ammonite section, raking light from the left ----------
// Overhead, with the Heron 60 mm macro (pupil magnification 0.8).
const ammoniteCamera = (iso: number) => ({ iso, aperture: 11, shutter: 1 / 200, magnification: 0.25, pupilMagnification: 0.8, ...corvidM2, centreColumn: 'reversed' as const });
/** The Marten 24 as the shelf holds it: GN 24 on its fixed head. */
const rake = (position: [number, number, number], power: number) => ({
	id: 'rake',
	kind: 'flash' as const,
	position,
	guideNumber: 24,
	power,
	lossStops: 0.7,
	aim: [0, 0, 0.015] as [number, number, number],
	beamAngleDeg: 25,
	kelvin: 5500
});
const silver = {
	id: 'silver',
	kind: 'reflector' as const,
	position: [0.3, 0.03, 0.05] as [number, number, number],
	areaM2: 0.09,
	reflectance: 0.8,
	surface: 'specular' as const,
	source: 'rake',
	normal: [-1, 0, 0.15] as [number, number, number]
};
const ammonitePlan = (withSilver: boolean): Plan => ({
	elements: {
		subject: { kind: 'subject', label: 'Ammonite section', widthM: 0.11, depthM: 0.09, heightM: 0.015, colour: '#b58a5a' },
		camera: { kind: 'camera', label: 'Corvid M2 overhead', position: [0, 0, 0.45], rotationDeg: 90, gearId: G.corvidM2.id },
		lens: { kind: 'label', label: 'Heron 60 mm macro', gearId: G.heron60.id, attachedTo: 'camera' },
		rake: { kind: 'flash', label: 'Marten 24, grid, raking', rotationDeg: 0, gearId: G.marten24.id },
		grid: { kind: 'modifier', label: '25° grid', attachedTo: 'rake', gearId: G.grid.id },
		...(withSilver ? { silver: { kind: 'reflector', label: 'Silver reflector', widthM: 0.3, depthM: 0.01, rotationDeg: 90, colour: '#c9ccd1', gearId: G.silver30.id } } : {}),
		shade: { kind: 'flag', label: 'Black card keeps flash off the lens', colour: '#202020' },
		board: { kind: 'background', label: 'Grey board', position: [0, 0, 0], widthM: 0.5, depthM: 0.4, colour: '#8a8a8a', locked: true }
	},
	viewport: { center: [0, 0], widthM: 1, depthM: 0.8 }
});
const ammoniteScene = (flashPos: [number, number, number], power: number, withSilver: boolean, iso: number) => ({
	camera: ammoniteCamera(iso),
	subject: { position: [0, 0, 0.015] as [number, number, number], facing: 'up' as const },
	lights: withSilver ? [rake(flashPos, power), silver] : [rake(flashPos, power)],
	flags: [{ id: 'shade', from: [-0.25, -0.12] as [number, number], to: [-0.1, -0.2] as [number, number] }]
});
const ammoniteNotes = [
	'# Ammonite section, polished face up',
	'',
	'Raking light from the left shows the sutures and the chamber walls. The lower the flash, the stronger the relief,',
	'and the faster the light falls off across the section: keep the reflector on the far side.',
	'',
	'Centre column reversed for the overhead view: the camera hangs between the legs, off the centre. Keep its weight',
	'over the middle, a leg under the lens, and turn it gently so it does not strike a leg.'
].join('\n');

const ammonite: DemoSetup = {
	id: DEMO_SETUP_IDS.ammonite,
	title: 'Ammonite section, raking light from the left',
	subject: 'Ammonite section (FGC-0833)',
	tags: ['fossils', 'ammonite', 'raking light', 'catalogue'],
	revisions: [
		{
			author: 'tobias',
			at: '2026-10-08T18:30:00Z',
			message: 'Raking flash from the left at 1/2: at 8 cm it meets the polished face at a glancing angle, so it needs more power than its distance says',
			document: doc(ammoniteScene([-0.45, 0, 0.08], 1 / 2, false, 100), ammonitePlan(false), ammoniteNotes, '2026-10-08T18:30:00Z')
		},
		{
			author: 'tobias',
			at: '2026-10-08T19:00:00Z',
			message: 'Silver reflector on the right lifts the shadows of the ribs',
			document: doc(ammoniteScene([-0.45, 0, 0.08], 1 / 2, true, 100), ammonitePlan(true), ammoniteNotes, '2026-10-08T18:30:00Z')
		},
		{
			author: 'mara',
			at: '2026-10-15T19:15:00Z',
			message: 'Flash lowered to 5 cm for a lower rake, and up to full power: the lower the rake, the less of it the face takes',
			document: doc(
				ammoniteScene([-0.45, 0, 0.05], 1, true, 100),
				ammonitePlan(true),
				`${ammoniteNotes}\n\nAt 5 cm the rake picks out the growth lines; check the far edge is not lost in shadow.`,
				'2026-10-08T18:30:00Z'
			)
		}
	]
};

// ---------- Dew-covered moss on the window sill ----------
const mossCamera = (shutter: number) => ({ iso: 400, aperture: 11, shutter, magnification: 1, pupilMagnification: 0.6, ...corvidM2, minAperture: 5.6, maxAperture: 22 });
const daylight = { ev100: 10, kelvin: 6500 };
const fill = {
	id: 'fill',
	kind: 'flash' as const,
	position: [0.25, -0.25, 0.2] as [number, number, number],
	...kestrelAt35,
	power: 1 / 64,
	lossStops: 1,
	kelvin: 5600
};
const mossPlan = (withFill: boolean): Plan => ({
	elements: {
		subject: { kind: 'subject', label: 'Moss cushion with dew', widthM: 0.08, depthM: 0.06, heightM: 0.03, colour: '#5f7f3a' },
		camera: { kind: 'camera', label: 'Corvid M2 + Heron 100 mm', position: [0, -0.3, 0.08], rotationDeg: 90, gearId: G.corvidM2.id },
		lens: { kind: 'label', label: 'Heron 100 mm macro', gearId: G.heron100.id, attachedTo: 'camera' },
		window: { kind: 'background', label: 'Window (overcast sky)', position: [0, 0.35, 0.3], widthM: 0.9, depthM: 0.05, colour: '#dfe8f0', locked: true },
		sill: { kind: 'table', label: 'Window sill', position: [0, 0.1, 0], widthM: 0.9, depthM: 0.3, colour: '#d8d2c4', locked: true },
		// The daylight through that window (its EV and kelvin are the scene's ambient), travelling into the room.
		daylight: { kind: 'ambient', label: 'North window, overcast', position: [0, 0.33, 0.3], rotationDeg: -90, widthM: 0.9, source: 'window' },
		...(withFill
			? {
					fill: { kind: 'flash', label: 'Kestrel 40 with dome (fill)', rotationDeg: 135, gearId: G.kestrel40.id },
					dome: { kind: 'diffuser', label: 'Opal dome', attachedTo: 'fill', gearId: G.dome.id }
				}
			: {})
	},
	viewport: { center: [0, 0], widthM: 1, depthM: 0.9 }
});
const mossNotes = [
	'# Dew on moss, window sill',
	'',
	'Overcast daylight through the north window; mist the moss with the plant sprayer a minute before shooting.',
	'Tripod, cable release, mirror lock-up: at 1:1 any shake shows.'
].join('\n');
const mossFillNote =
	'The fill flash puts a sparkle in each drop. The daylight makes most of the exposure, so the flash does not freeze a drop that trembles: wait for still air (close the window, hold your breath).';

const moss: DemoSetup = {
	id: DEMO_SETUP_IDS.moss,
	title: 'Dew-covered moss on the window sill',
	subject: 'Moss sample with dew',
	tags: ['window light', 'fill flash', 'workshop', 'small light big detail'],
	revisions: [
		{
			author: 'mara',
			at: '2026-10-10T10:15:00Z',
			message: 'Window light only, 1/15 s at f/11',
			document: doc({ camera: mossCamera(1 / 15), subject: { position: [0, 0, 0.03] }, ambient: daylight, lights: [] }, mossPlan(false), mossNotes, '2026-10-10T10:15:00Z')
		},
		{
			author: 'tobias',
			at: '2026-10-10T10:40:00Z',
			message: 'Fill flash in the dome at 1/64, under the daylight',
			document: doc(
				{ camera: mossCamera(1 / 15), subject: { position: [0, 0, 0.03] }, ambient: daylight, lights: [fill] },
				mossPlan(true),
				`${mossNotes}\n\n${mossFillNote}`,
				'2026-10-10T10:40:00Z'
			)
		},
		{
			author: 'mara',
			at: '2026-10-17T10:05:00Z',
			message: 'Shutter to 1/8 s: more of the daylight; the drops must be still, the flash is only a sparkle',
			document: doc(
				{ camera: mossCamera(1 / 8), subject: { position: [0, 0, 0.03] }, ambient: daylight, lights: [fill] },
				mossPlan(true),
				`${mossNotes}\n\n${mossFillNote}\nUsed for the workshop “Small Light, Big Detail”, exercise 2.`,
				'2026-10-10T10:40:00Z'
			)
		}
	]
};

/** In the order they are made (an origin before its duplicate). */
export const DEMO_SETUPS: DemoSetup[] = [quartz, ammonite, moss, amethyst];
