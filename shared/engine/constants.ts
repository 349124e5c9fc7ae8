/**
 * Engine-wide constants.
 *
 * Units: plan coordinates and lengths in feet, small sizes (gaps, laps, coverage widths) in inches,
 * areas in square feet, net free area in square inches, money in integer cents.
 */

/** The one tolerance (feet) for "same point", "collinear" and "horizontal" across the whole engine. */
export const TOL = 0.01;

/** Square inches per square foot (12 in × 12 in). */
export const SQIN_PER_SQFT = 144;

/** Inches per foot. */
export const IN_PER_FT = 12;
