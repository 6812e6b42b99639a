/**
 * Falloff: the inverse-square law, Lambert's cosine law and the beam of a light that is not aimed at
 * the subject; plus the plan geometry (3-D distances and flags crossing a path in plan).
 */

export type Vec3 = readonly [number, number, number];
export type Vec2 = readonly [number, number];

export function subtract3(a: Vec3, b: Vec3): Vec3 {
	return [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
}

/**
 * The length of a vector. `Math.sqrt` of the squares rather than `Math.hypot`, which guards against
 * overflow far outside any table (coordinates are capped at 10 km) and is several times slower; this
 * runs for every light on every request and for every cell of the falloff map.
 */
export function length3(v: Vec3): number {
	return Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
}

export function distanceM(a: Vec3, b: Vec3): number {
	return length3(subtract3(a, b));
}

export function dot3(a: Vec3, b: Vec3): number {
	return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/** Angle in degrees between two directions; 0 when either is the zero vector. */
export function angleBetweenDeg(a: Vec3, b: Vec3): number {
	const la = length3(a);
	const lb = length3(b);
	if (la === 0 || lb === 0) return 0;
	const c = Math.min(1, Math.max(-1, dot3(a, b) / (la * lb)));
	return (Math.acos(c) * 180) / Math.PI;
}

/** cos of the angle between two directions, clamped to 0 behind (a surface facing away gets nothing). */
export function facingCosine(normal: Vec3, towards: Vec3): number {
	const ln = length3(normal);
	const lt = length3(towards);
	if (ln === 0 || lt === 0) return 1;
	return Math.max(0, dot3(normal, towards) / (ln * lt));
}

/**
 * Inverse-square law: illuminance E = I / d² (lux from candela and metres) on a surface facing the
 * source; with Lambert's cosine law E = I·cos θ / d² for a surface tilted by θ.
 */
export function illuminanceLux(intensityCd: number, distanceM: number, incidenceDeg = 0): number {
	const c = Math.cos((incidenceDeg * Math.PI) / 180);
	return (intensityCd * Math.max(0, c)) / (distanceM * distanceM);
}

/** Stops gained (+) or lost (−) moving a light from `fromM` to `toM`: −2·log2(to/from). */
export function inverseSquareStops(fromM: number, toM: number): number {
	return -2 * Math.log2(toM / fromM);
}

/**
 * Off-axis falloff of a light with a beam angle. Model (our choice, stated): the intensity follows
 * cos^n(θ) of the angle θ off the beam axis, with n chosen so that the intensity is half the on-axis
 * value at half the beam angle (the beam angle taken as the full width at half maximum, as luminaire
 * data sheets usually define it). Behind the light (θ ≥ 90°) it is 0. A beam of 180° or more is treated
 * as a Lambertian emitter (n = 1).
 */
export function beamFactor(offAxisDeg: number, beamAngleDeg: number): number {
	if (offAxisDeg >= 90) return 0;
	return beamFactorFromCosine(Math.cos((offAxisDeg * Math.PI) / 180), beamExponent(beamAngleDeg));
}

/** `beamFactor` from cos θ and the exponent n: cos^n θ, 0 from 90° on (for a light met at many points). */
export function beamFactorFromCosine(cosOffAxis: number, exponent: number): number {
	return cosOffAxis <= 0 ? 0 : Math.min(1, cosOffAxis) ** exponent;
}

export function beamExponent(beamAngleDeg: number): number {
	if (beamAngleDeg >= 180) return 1;
	const cosHalf = Math.cos((beamAngleDeg * Math.PI) / 360);
	return Math.log(0.5) / Math.log(cosHalf);
}

const SEGMENT_EPS = 1e-12;

/** A point seen in plan: its x and y (a 3-D point's height is left out). */
type InPlan = Vec2 | Vec3;

/** Which side of a–b the point c is on (−1, 0, 1), within the tolerance. */
function orientation(a: InPlan, b: InPlan, c: InPlan): number {
	const v = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
	return Math.abs(v) < SEGMENT_EPS ? 0 : Math.sign(v);
}

/** Is c, collinear with a–b, within the segment's box? */
function withinBox(a: InPlan, b: InPlan, c: InPlan): boolean {
	return (
		Math.min(a[0], b[0]) - SEGMENT_EPS <= c[0] &&
		c[0] <= Math.max(a[0], b[0]) + SEGMENT_EPS &&
		Math.min(a[1], b[1]) - SEGMENT_EPS <= c[1] &&
		c[1] <= Math.max(a[1], b[1]) + SEGMENT_EPS
	);
}

/**
 * Do the closed plan segments p1–p2 and q1–q2 meet (touching counts)? Orientation test with a small
 * tolerance so a flag that just touches the path blocks it. 3-D ends are taken in plan.
 */
export function segmentsIntersect(p1: InPlan, p2: InPlan, q1: InPlan, q2: InPlan): boolean {
	const o1 = orientation(p1, p2, q1);
	const o2 = orientation(p1, p2, q2);
	const o3 = orientation(q1, q2, p1);
	const o4 = orientation(q1, q2, p2);
	if (o1 !== o2 && o3 !== o4) return true;
	if (o1 === 0 && withinBox(p1, p2, q1)) return true;
	if (o2 === 0 && withinBox(p1, p2, q2)) return true;
	if (o3 === 0 && withinBox(q1, q2, p1)) return true;
	if (o4 === 0 && withinBox(q1, q2, p2)) return true;
	return false;
}

/** Shortest plan distance from a point to a segment (for "a hot lamp near a flag"). */
export function pointSegmentDistanceM(p: Vec2, a: Vec2, b: Vec2): number {
	const abx = b[0] - a[0];
	const aby = b[1] - a[1];
	const len2 = abx * abx + aby * aby;
	const t = len2 === 0 ? 0 : Math.min(1, Math.max(0, ((p[0] - a[0]) * abx + (p[1] - a[1]) * aby) / len2));
	const dx = p[0] - (a[0] + t * abx);
	const dy = p[1] - (a[1] + t * aby);
	return Math.sqrt(dx * dx + dy * dy);
}

export function plan(v: Vec3): Vec2 {
	return [v[0], v[1]];
}
