/**
 * Slope arithmetic for a roof pitch p (rise in inches per 12 in of run).
 * Framing-square rafter tables: common rafter length per foot of run = √(144 + p²) in;
 * hip or valley length per foot of common run (equal pitches) = √(288 + p²) in.
 */
import type { Pitch } from "../units";

/** Sloped length per unit of horizontal run: √(p² + 12²) / 12. */
export const slopeFactor = (p: Pitch | number): number => Math.hypot(p, 12) / 12;

/** Roof angle from the horizontal, degrees: atan(p / 12). */
export const slopeAngleDeg = (p: Pitch | number): number => (Math.atan(p / 12) * 180) / Math.PI;

/** Percent slope: 100 · p / 12. */
export const slopePercent = (p: Pitch | number): number => (100 * p) / 12;

/** Common rafter length per foot of run, inches: √(144 + p²). */
export const commonInPerFtRun = (p: Pitch | number): number => Math.sqrt(144 + p * p);

/** Hip or valley rafter length per foot of common run, inches (equal pitches): √(288 + p²). */
export const hipValleyInPerFtRun = (p: Pitch | number): number => Math.sqrt(288 + p * p);

/** Hip or valley factor: hip length per unit of common run = √(288 + p²) / 12. */
export const hipValleyFactor = (p: Pitch | number): number => hipValleyInPerFtRun(p) / 12;

/** True (sloped) area of a plane from its plan area. */
export const slopedArea = (planAreaSqFt: number, p: Pitch | number): number => planAreaSqFt * slopeFactor(p);

/** Roofing squares: 1 square = 100 ft² of roof surface (common practice). */
export const squares = (slopedAreaSqFt: number): number => slopedAreaSqFt / 100;

/** Pitch from an angle in degrees (inverse of slopeAngleDeg). */
export const pitchFromAngleDeg = (deg: number): number => 12 * Math.tan((deg * Math.PI) / 180);
