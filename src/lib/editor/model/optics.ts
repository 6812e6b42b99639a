/**
 * The camera's field of view on the plan, from the thin-lens equation (1/f = 1/u + 1/v with
 * magnification m = v/u): the lens focuses at u = f·(1 + 1/m) in front of it and the image lies at
 * v = f·(1 + m) behind it, so the horizontal angle of view is 2·atan(sensor width / 2v) and the field
 * covered at the plane of focus is sensor width / m. (The thin-lens relations of any optics textbook,
 * e.g. E. Hecht, Optics, chapter 5; cited from memory. A real macro lens departs from them by its pupil
 * magnification and internal focusing.)
 */
import { direction2 } from './geometry';
import type { CameraElement, CameraSettings } from './schema';
import type { Vec2 } from './types';

export interface FieldOfView {
	apex: Vec2;
	rotationDeg: number;
	/** Full horizontal angle of view. */
	angleDeg: number;
	/** Lens to the plane of focus (null at m = 0: focused far away). */
	focusDistanceM: number | null;
	/** Width and height of the field at the plane of focus (null at m = 0). */
	fieldWidthM: number | null;
	fieldHeightM: number | null;
	/** How far to draw the wedge. */
	drawLengthM: number;
}

export function angleOfViewDeg(sensorWidthMm: number, focalLengthMm: number, magnification: number): number {
	const imageDistanceMm = focalLengthMm * (1 + magnification);
	return (2 * Math.atan(sensorWidthMm / (2 * imageDistanceMm)) * 180) / Math.PI;
}

export function focusDistanceM(focalLengthMm: number, magnification: number): number | null {
	return magnification > 0 ? (focalLengthMm * (1 + 1 / magnification)) / 1000 : null;
}

export function fieldOfView(camera: CameraElement, settings: CameraSettings, subjectDistanceM: number | null): FieldOfView {
	const m = settings.magnification;
	const u = focusDistanceM(camera.focalLengthMm, m);
	const reach = Math.max(u ?? 0, subjectDistanceM ?? 0);
	return {
		apex: [camera.xM, camera.yM],
		rotationDeg: camera.rotationDeg,
		angleDeg: angleOfViewDeg(camera.sensorWidthMm, camera.focalLengthMm, m),
		focusDistanceM: u,
		fieldWidthM: m > 0 ? camera.sensorWidthMm / m / 1000 : null,
		fieldHeightM: m > 0 ? camera.sensorHeightMm / m / 1000 : null,
		drawLengthM: reach > 0 ? reach * 1.15 : 0.5
	};
}

/** The two far corners of the wedge (for drawing). */
export function fieldOfViewCorners(fov: FieldOfView, lengthM = fov.drawLengthM): [Vec2, Vec2] {
	const half = fov.angleDeg / 2;
	const reach = lengthM / Math.cos((half * Math.PI) / 180);
	const a = direction2(fov.rotationDeg - half);
	const b = direction2(fov.rotationDeg + half);
	return [
		[fov.apex[0] + a[0] * reach, fov.apex[1] + a[1] * reach],
		[fov.apex[0] + b[0] * reach, fov.apex[1] + b[1] * reach]
	];
}
