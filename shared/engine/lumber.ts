/**
 * Dressed (actual) sizes of dry softwood lumber, NIST Voluntary Product Standard PS 20
 * (American Softwood Lumber Standard), dry dressed sizes: nominal 1 in → 3/4 in, nominal 2 in → 1-1/2 in,
 * nominal 3 in → 2-1/2 in, nominal 4 in → 3-1/2 in.
 *
 * Battens and counter-battens are laid flat, so a batten's thickness is the height it adds to the gap
 * and its width is the part of the channel it blocks.
 */
export const LUMBER_NOMINALS = ["1x3", "1x4", "2x2", "2x4"] as const;
export type LumberNominal = (typeof LUMBER_NOMINALS)[number];

export interface LumberSize {
  /** Dressed thickness in inches (the height of the piece laid flat). */
  thicknessIn: number;
  /** Dressed width in inches (the face laid on the deck). */
  widthIn: number;
}

export const LUMBER: Readonly<Record<LumberNominal, Readonly<LumberSize>>> = {
  "1x3": { thicknessIn: 0.75, widthIn: 2.5 },
  "1x4": { thicknessIn: 0.75, widthIn: 3.5 },
  "2x2": { thicknessIn: 1.5, widthIn: 1.5 },
  "2x4": { thicknessIn: 1.5, widthIn: 3.5 },
};

/** Dressed size of a nominal piece. */
export const lumberSize = (nominal: LumberNominal): LumberSize => LUMBER[nominal];
