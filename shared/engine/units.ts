/**
 * Branded units for the roof engine. Conventions used throughout `shared/engine`:
 * - Plan coordinates are feet, x to the east, y to the north (y up, mathematical orientation).
 * - A polygon's winding is read from its signed (shoelace) area: positive = counter-clockwise.
 * - Lengths in feet unless the name ends in `In` (inches); areas in ft²; net free area in in².
 * The brands are erased at run time; they only keep feet and inches apart in signatures.
 */
export type Feet = number & { readonly __unit: "ft" };
export type Inches = number & { readonly __unit: "in" };
export type SquareFeet = number & { readonly __unit: "ft²" };
/** Roof pitch as rise per 12 of run: 6 means a 6/12 roof. */
export type Pitch = number & { readonly __unit: "rise/12" };

export const ft = (n: number) => n as Feet;
export const inches = (n: number) => n as Inches;
export const sqft = (n: number) => n as SquareFeet;
export const pitch = (rise: number) => rise as Pitch;

/** A plan-view point [x, y] in feet. */
export type PlanPoint = readonly [number, number];
