/**
 * Exposure per face of the subject. A card opposite the key does not add to the face the key lights:
 * it fills the other one. So the subject is read as two faces the camera sees, each at 45° to the
 * camera axis: the lit face turned toward the key, the shadow face turned away from it (normals
 * v + k̂ and v − k̂, v toward the camera, k̂ the key's direction across the axis). Each light gives a face
 * X × cos θ (Lambert's cosine law: irradiance on a surface goes with the cosine of the angle of
 * incidence; any optics textbook, e.g. Hecht, "Optics", on irradiance; from memory), nothing where it
 * comes from behind. The ambient is taken as coming from all round: the same on both faces.
 * Without a camera axis (no camera position, no facing), the lit face looks straight at the key and the
 * shadow face straight away from it.
 *
 * The ratio shown is lit face : shadow face. A fill that reaches both faces (near the camera axis) is in
 * both, so the ratio is the usual key + fill : fill; a card opposite the key reaches only the shadow
 * face, so the ratio is key : fill. `ratioConvention` says which of the two the scene gave.
 */
import { length3, subtract3, dot3, type Vec3 } from './geometry';
import type { LightField } from './light-field';

export interface FaceExposure {
	x: number;
	/** log2(x); null when nothing reaches the face. */
	exposureOffsetStops: number | null;
	normal: Vec3;
}

export interface SubjectFaces {
	lit: FaceExposure;
	shadow: FaceExposure;
	/** lit.x / shadow.x; null when nothing reaches the shadow face. */
	ratio: number | null;
	ratioConvention: 'key+fill : fill' | 'key : fill';
}

const unit = (v: Vec3): Vec3 => {
	const l = length3(v);
	return [v[0] / l, v[1] / l, v[2] / l];
};
const add = (a: Vec3, b: Vec3, k = 1): Vec3 => [a[0] + k * b[0], a[1] + k * b[1], a[2] + k * b[2]];

/** The lit and shadow faces' normals for a key direction and an optional camera axis. */
export function faceNormals(keyDirection: Vec3, view: Vec3 | undefined): { lit: Vec3; shadow: Vec3 } {
	const k = unit(keyDirection);
	if (!view) return { lit: k, shadow: [-k[0], -k[1], -k[2]] };
	const v = unit(view);
	const across = add(k, v, -dot3(k, v));
	// A key on the camera axis lights both faces alike.
	if (length3(across) < 1e-9) return { lit: v, shadow: v };
	const a = unit(across);
	return { lit: unit(add(v, a)), shadow: unit(add(v, a, -1)) };
}

/**
 * The two faces at the subject, with `key` the index of the key in `field.lights` and `blocked[i]` whether
 * a flag stops light i (worked out once by the caller).
 */
export function subjectFaces(field: LightField, subject: Vec3, key: number, view: Vec3 | undefined, blocked: readonly boolean[]): SubjectFaces {
	const normals = faceNormals(subtract3(field.lights[key].position, subject), view);
	let litX = field.ambientX;
	let shadowX = field.ambientX;
	let fillOnLit = field.ambientX; // the usual convention holds when some fill reaches the lit face too
	field.lights.forEach((l, i) => {
		if (blocked[i]) return;
		const lit = l.xAt(subject, normals.lit);
		litX += lit;
		if (i !== key) fillOnLit += lit;
		shadowX += l.xAt(subject, normals.shadow);
	});
	const face = (x: number, normal: Vec3): FaceExposure => ({ x, exposureOffsetStops: x > 0 ? Math.log2(x) : null, normal });
	return {
		lit: face(litX, normals.lit),
		shadow: face(shadowX, normals.shadow),
		ratio: shadowX > 0 ? litX / shadowX : null,
		ratioConvention: fillOnLit > 0 ? 'key+fill : fill' : 'key : fill'
	};
}
