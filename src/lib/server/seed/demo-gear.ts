// The demo gear shelf of the Fernhill Geology Circle (invented, see BRIEF.md). Model names are
// invented; figures are realistic for small flashes and macro lenses but are demo data, not measurements.
import type { GearKind } from '$lib/scene/gear';

export interface DemoGear {
	id: string;
	kind: GearKind;
	name: string;
	spec: Record<string, unknown>;
	notes: string;
	retired?: boolean;
}

export const DEMO_GEAR = {
	kestrel40: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000a001',
		kind: 'flash',
		name: 'Kestrel 40 speedlight',
		spec: {
			// A GN 40 class speedlight is rated at its longest zoom (105 mm); at 35 mm, where the club keeps it, it gives GN 28.
			guideNumberM: 28,
			lowestPower: 1 / 256,
			syncSpeedS: 1 / 250,
			calibrationOffsetStops: -0.3,
			zoomMm: 35,
			guideNumbersByZoom: [
				{ zoomMm: 24, guideNumberM: 24 },
				{ zoomMm: 35, guideNumberM: 28 },
				{ zoomMm: 50, guideNumberM: 32 },
				{ zoomMm: 105, guideNumberM: 40 }
			],
			kelvin: 5600,
			mainsPowered: false
		},
		notes: 'Club flash no. 1, kept at 35 mm (GN 28). Measured against the club meter in March: a third of a stop under its rating.'
	},
	marten24: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000a002',
		kind: 'flash',
		name: 'Marten 24 compact flash',
		spec: { guideNumberM: 24, lowestPower: 1 / 128, syncSpeedS: 1 / 200, calibrationOffsetStops: 0, zoomMm: 35, kelvin: 5500, mainsPowered: false },
		notes: 'Small and light, fixed head covering a 35 mm lens (GN 24 there): the one for raking light, it sits flat on the table. Stops at 1/128.'
	},
	kestrel36: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000a003',
		kind: 'flash',
		name: 'Kestrel 36 speedlight (old)',
		spec: { guideNumberM: 36, lowestPower: 1 / 64, syncSpeedS: 1 / 200, calibrationOffsetStops: -0.7, zoomMm: 85, mainsPowered: false },
		notes: 'Battery door broken; kept for parts.',
		retired: true
	},
	softbox30: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000b001',
		kind: 'modifier',
		name: 'Larkspur 30 cm softbox',
		spec: { shape: 'softbox', lossStops: 1.7, beamAngleDeg: 90, widthM: 0.3, heightM: 0.3 },
		notes: 'Light loss measured with the club meter at 50 cm, bare head against softbox.'
	},
	dome: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000b002',
		kind: 'modifier',
		name: 'Opal diffuser dome',
		spec: { shape: 'dome', lossStops: 1, beamAngleDeg: 120 },
		notes: ''
	},
	grid: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000b003',
		kind: 'modifier',
		name: 'Honeycomb grid, 25°',
		spec: { shape: 'grid', lossStops: 0.7, beamAngleDeg: 25 },
		notes: 'Keeps a raking flash off the background.'
	},
	whiteCard: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000c001',
		kind: 'reflector',
		name: 'White foam card 20 × 30 cm',
		spec: { widthM: 0.2, heightM: 0.3, reflectance: 0.85, surface: 'diffuse' },
		notes: 'Cut from the hall’s display board offcuts.'
	},
	silver30: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000c002',
		kind: 'reflector',
		name: 'Silver reflector 30 cm',
		spec: { widthM: 0.3, heightM: 0.3, reflectance: 0.8, surface: 'specular' },
		notes: 'Mirror-like: never aim it where it can catch the sun.'
	},
	heron100: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000d001',
		kind: 'lens',
		name: 'Heron 100 mm f/2.8 macro',
		spec: { focalLengthMm: 100, maxMagnification: 1, pupilMagnification: 0.6, widestAperture: 2.8, narrowestAperture: 32 },
		notes: 'Internal focusing: its exit pupil is small (pupil magnification about 0.6), so it loses more light at 1:1 than the bellows rule for a symmetric lens says.'
	},
	heron60: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000d002',
		kind: 'lens',
		name: 'Heron 60 mm f/2.8 macro',
		spec: { focalLengthMm: 60, maxMagnification: 1, pupilMagnification: 0.8, widestAperture: 2.8, narrowestAperture: 32 },
		notes: 'Short working distance at 1:1: mind the lens shadow.'
	},
	corvidM2: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000e001',
		kind: 'camera',
		name: 'Corvid M2 body',
		spec: { sensorWidthMm: 36, sensorHeightMm: 24, cocMm: 0.029, pixelPitchUm: 6, syncSpeedS: 1 / 200 },
		notes: 'The club’s catalogue camera.'
	},
	corvidA1: {
		id: '7e1a9b30-4c2d-4f1e-9a0b-00000000e002',
		kind: 'camera',
		name: 'Corvid A1 body',
		spec: { sensorWidthMm: 23.5, sensorHeightMm: 15.6, cocMm: 0.019, pixelPitchUm: 3.9, syncSpeedS: 1 / 250 },
		notes: 'Smaller sensor; lent out for the workshop.'
	}
} satisfies Record<string, DemoGear>;
