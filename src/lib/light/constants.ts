/** Metres in one international foot and inch (exact by definition, the 1959 international yard). */
export const METRES_PER_FOOT = 0.3048;
export const METRES_PER_INCH = 0.0254;
