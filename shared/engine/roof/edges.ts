/**
 * Shared edges and edge types.
 *
 * Two plane edges are shared where their plan segments are collinear (within TOL) and overlap by more
 * than TOL; the edges are split at the ends of the overlap, so a long eave that is half against another
 * plane becomes two pieces. Each piece is typed from the 3D geometry:
 * - shared, horizontal: the top of both planes → ridge; top of one, bottom of the other → transition
 *   (a change of slope, IRC R903.2.1 asks for flashing there); the bottom of both (a level trough) →
 *   valley (not covered by the rules above; a trough collects water like a valley).
 * - shared, sloped: probe 0.1 ft into each plane, perpendicular to the edge from its midpoint; both lower
 *   than the edge → hip, both higher → valley, one of each → transition.
 * - unshared, horizontal: the plane rises away → eave; falls away → headwall; a level plane → eave.
 * - unshared, sloped → rake. Sidewall only by the user's override.
 * A shared piece is counted once in the totals (on the plane that comes first in the input).
 *
 * Pairing compares only edges whose bounding boxes overlap, found through the planes' boxes (a sweep).
 */
import { TOL } from "../constants";
import type { Advisory } from "../advisory";
import { advisory } from "../advisory";
import type { EdgeType } from "./edge-types";
import { hypot2, type PlaneGeometry } from "./geometry";
import { sortPrefix, type Pt } from "./polygon";

/** Probe distance into each plane for the hip/valley test, ft. */
export const EDGE_PROBE_FT = 0.1;
/** Heights of two planes along a shared edge may differ by this much before a warning, ft. */
export const HEIGHT_MISMATCH_FT = 0.05;

export interface EdgePiece {
  planeIdx: number;
  planeId: string;
  edgeIndex: number;
  part: number;
  from: Pt;
  to: Pt;
  planLengthFt: number;
  trueLengthFt: number;
  z0: number;
  z1: number;
  horizontal: boolean;
  shared: boolean;
  partner: { planeIdx: number; planeId: string; edgeIndex: number } | null;
  computedType: EdgeType;
  type: EdgeType;
  overridden: boolean;
  /** True on exactly one side of a shared piece (and on every unshared piece): the one counted in totals. */
  counted: boolean;
}

export interface EdgeTotals {
  eaveLf: number;
  rakeLf: number;
  ridgeLf: number;
  hipLf: number;
  valleyLf: number;
  transitionLf: number;
  sidewallLf: number;
  headwallLf: number;
}

const zeroTotals = (): EdgeTotals => ({ eaveLf: 0, rakeLf: 0, ridgeLf: 0, hipLf: 0, valleyLf: 0, transitionLf: 0, sidewallLf: 0, headwallLf: 0 });

/** Add a length to the EdgeTotals field of its edge type (a switch: the fields are fixed, so no keyed store). */
function addToTotals(t: EdgeTotals, type: EdgeType, lf: number): void {
  switch (type) {
    case "eave": t.eaveLf += lf; break;
    case "rake": t.rakeLf += lf; break;
    case "ridge": t.ridgeLf += lf; break;
    case "hip": t.hipLf += lf; break;
    case "valley": t.valleyLf += lf; break;
    case "transition": t.transitionLf += lf; break;
    case "sidewall": t.sidewallLf += lf; break;
    case "headwall": t.headwallLf += lf; break;
  }
}

/** True length per edge type over the counted pieces (each shared piece once). */
export function edgeTotalsOf(byPlane: EdgePiece[][]): EdgeTotals {
  const totals = zeroTotals();
  for (const pieces of byPlane) for (const pc of pieces) if (pc.counted) addToTotals(totals, pc.type, pc.trueLengthFt);
  return totals;
}

/** A run: counted pieces of one type joined end to end along one straight line (one ridge, one eave …). */
export interface EdgeRun {
  type: EdgeType;
  lengthFt: number;
  planLengthFt: number;
  planeIds: string[];
  pieces: EdgePiece[];
}

type Overrides = (planeIdx: number, edgeIndex: number) => EdgeType | undefined;

const param = (p: Pt, a: Pt, b: Pt) => {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  return ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len;
};

/**
 * The edges of all planes as columns of numbers, for the overlap search. Row r is the r-th edge in input
 * order (plane by plane, `PlaneGeometry.edges` order); x0…y1 is its bounding box grown by TOL. `hyp` is
 * Math.hypot(dx, dy), the length the line tests divide by; `len` is √(dx² + dy²), the edge length used for
 * the degenerate-edge test, the clamp and the overlap's end points (the two can differ in the last bit;
 * each is used where it always has been, so results stay bit for bit the same). Per plane: the union of
 * its edges' boxes. One table is kept and grown, so a takeoff does not allocate a score of typed arrays
 * each time (the search calls nothing outside this file, so it cannot be re-entered).
 */
class EdgeTable {
  ax = new Float64Array(0);
  ay = new Float64Array(0);
  bx = new Float64Array(0);
  by = new Float64Array(0);
  dx = new Float64Array(0);
  dy = new Float64Array(0);
  hyp = new Float64Array(0);
  len = new Float64Array(0);
  x0 = new Float64Array(0);
  x1 = new Float64Array(0);
  y0 = new Float64Array(0);
  y1 = new Float64Array(0);
  /** Plane of each row, and the edge's `index` in it. */
  plane = new Int32Array(0);
  edge = new Int32Array(0);
  px0 = new Float64Array(0);
  px1 = new Float64Array(0);
  py0 = new Float64Array(0);
  py1 = new Float64Array(0);
  /** Plane indexes sorted by px0, then the sweep's active planes; `planeTmp` is the merge sort's buffer. */
  planeOrder = new Int32Array(0);
  planeActive = new Int32Array(0);
  planeTmp = new Int32Array(0);
  /** First edge row of each plane (rowStart[p] … rowStart[p + 1] − 1), and each row's side (falls / level / rises). */
  rowStart = new Int32Array(0);
  sides = new Int8Array(0);
  /**
   * The overlaps found, one entry per edge of each overlapping pair, in the order found: the row it belongs
   * to, the overlap as distances t0 < t1 along that edge, and the partner edge's row. `ovList` then holds the
   * entries row by row (row r's from ovStart[r] to ovStart[r + 1]), each row's in its partners' sweep order.
   * Numbers in columns rather than an object and a list per overlap: no allocation per overlap.
   */
  nOv = 0;
  ovRow = new Int32Array(64);
  ovT0 = new Float64Array(64);
  ovT1 = new Float64Array(64);
  ovPartner = new Int32Array(64);
  ovList = new Int32Array(64);
  ovStart = new Int32Array(0);

  /** Room for one more overlap entry (doubling, keeping the entries so far). */
  growOv(): void {
    const c = this.ovRow.length * 2;
    const grow32 = (a: Int32Array) => {
      const b = new Int32Array(c);
      b.set(a);
      return b;
    };
    const grow64 = (a: Float64Array) => {
      const b = new Float64Array(c);
      b.set(a);
      return b;
    };
    this.ovRow = grow32(this.ovRow);
    this.ovT0 = grow64(this.ovT0);
    this.ovT1 = grow64(this.ovT1);
    this.ovPartner = grow32(this.ovPartner);
    this.ovList = new Int32Array(c);
  }

  /** Add an overlap entry to `row`'s. */
  addOv(row: number, t0: number, t1: number, partner: number): void {
    if (this.nOv === this.ovRow.length) this.growOv();
    const e = this.nOv++;
    this.ovRow[e] = row;
    this.ovT0[e] = t0;
    this.ovT1[e] = t1;
    this.ovPartner[e] = partner;
  }

  reserve(rows: number, planes: number): void {
    if (rows > this.ax.length) {
      const c = Math.max(rows, this.ax.length * 2, 64);
      this.ax = new Float64Array(c);
      this.ay = new Float64Array(c);
      this.bx = new Float64Array(c);
      this.by = new Float64Array(c);
      this.dx = new Float64Array(c);
      this.dy = new Float64Array(c);
      this.hyp = new Float64Array(c);
      this.len = new Float64Array(c);
      this.x0 = new Float64Array(c);
      this.x1 = new Float64Array(c);
      this.y0 = new Float64Array(c);
      this.y1 = new Float64Array(c);
      this.plane = new Int32Array(c);
      this.edge = new Int32Array(c);
      this.sides = new Int8Array(c);
      this.ovStart = new Int32Array(c + 1);
    }
    if (planes > this.px0.length) {
      const c = Math.max(planes, this.px0.length * 2, 16);
      this.px0 = new Float64Array(c);
      this.px1 = new Float64Array(c);
      this.py0 = new Float64Array(c);
      this.py1 = new Float64Array(c);
      this.planeOrder = new Int32Array(c);
      this.planeActive = new Int32Array(c);
      this.planeTmp = new Int32Array(c);
      this.rowStart = new Int32Array(c + 1);
    }
  }
}
const table = new EdgeTable();

/**
 * Find collinear overlaps between edges of different planes: afterwards row r's overlaps are the entries
 * ovList[ovStart[r]] … ovList[ovStart[r + 1] − 1] of the edge table (`table.rowStart` filled for `planes`).
 *
 * The results are defined by a sweep over all edges sorted by x0 (ties in input order): an edge is
 * compared with each earlier one whose box overlaps its own, and each overlap is worked out from the line
 * of the later edge of the two (`cur`) first, the other edge's interval from the first one's end points;
 * so each edge's list comes in the sweep order of its partners. Sorting every edge costs more than the rest
 * of the search, so this finds the same pairs another way: planes whose boxes overlap (a sweep over the far
 * fewer planes), then their edges pairwise; which edge of a pair is `cur` comes from comparing the two
 * edges' sort keys, and each edge's (short) list is put in its partners' sweep order at the end.
 */
function findOverlaps(planes: PlaneGeometry[]): void {
  const T = table;
  const nPlanes = planes.length;
  const { rowStart } = T;
  const m = rowStart[nPlanes];
  const { ax, ay, bx, by, dx, dy, hyp, len, x0, x1, y0, y1, plane, edge, px0, px1, py0, py1, planeOrder, planeActive } = T;
  for (let p = 0, r = 0; p < nPlanes; p++) {
    const edges = planes[p].edges;
    let bx0 = Infinity, bx1 = -Infinity, by0 = Infinity, by1 = -Infinity;
    for (let k = 0; k < edges.length; k++, r++) {
      const ed = edges[k];
      const a = ed.from;
      const b = ed.to;
      ax[r] = a[0];
      ay[r] = a[1];
      bx[r] = b[0];
      by[r] = b[1];
      const ex = b[0] - a[0];
      const ey = b[1] - a[1];
      dx[r] = ex;
      dy[r] = ey;
      // planeGeometry's planLengthFt is Math.hypot(to − from), the very number (hypot is costly).
      hyp[r] = ed.planLengthFt;
      len[r] = Math.sqrt(ex * ex + ey * ey);
      x0[r] = Math.min(a[0], b[0]) - TOL;
      x1[r] = Math.max(a[0], b[0]) + TOL;
      y0[r] = Math.min(a[1], b[1]) - TOL;
      y1[r] = Math.max(a[1], b[1]) + TOL;
      plane[r] = p;
      edge[r] = ed.index;
      if (x0[r] < bx0) bx0 = x0[r];
      if (x1[r] > bx1) bx1 = x1[r];
      if (y0[r] < by0) by0 = y0[r];
      if (y1[r] > by1) by1 = y1[r];
    }
    px0[p] = bx0;
    px1[p] = bx1;
    py0[p] = by0;
    py1[p] = by1;
    planeOrder[p] = p;
  }
  sortByKey(planeOrder, T.planeTmp, px0, nPlanes);

  T.nOv = 0;
  // Sweep over the planes by px0: each plane against the earlier ones whose boxes overlap its own.
  let nActive = 0;
  for (let s = 0; s < nPlanes; s++) {
    const c = planeOrder[s];
    let w = 0;
    for (let k = 0; k < nActive; k++) {
      const o = planeActive[k];
      if (px1[o] >= px0[c]) planeActive[w++] = o;
    }
    nActive = w;
    for (let k = 0; k < nActive; k++) {
      const o = planeActive[k];
      if (py1[o] < py0[c] || py1[c] < py0[o]) continue;
      const oEnd = rowStart[o + 1];
      for (let i = rowStart[c]; i < rowStart[c + 1]; i++) {
        // An edge no longer than TOL overlaps nothing.
        if (len[i] <= TOL) continue;
        const ix0 = x0[i], ix1 = x1[i], iy0 = y0[i], iy1 = y1[i];
        for (let j = rowStart[o]; j < oEnd; j++) {
          if (len[j] <= TOL) continue;
          // Boxes apart: no overlap. (overlapPair's own first test, made here without the call and on both
          // sides, since which edge is `cur` is not settled yet; x0 ≤ x1 on every row, so for the later edge
          // of the two its start is never past the other's end, and the two tests reject the same pairs.)
          if (x1[j] < ix0 || ix1 < x0[j] || y1[j] < iy0 || iy1 < y0[j]) continue;
          // The later of the two in the sweep order is `cur`.
          if (ix0 < x0[j] || (ix0 === x0[j] && i < j)) overlapPair(j, i);
          else overlapPair(i, j);
        }
      }
    }
    planeActive[nActive++] = c;
  }
  // The entries row by row (a counting sort), then each row's in its partners' sweep order (insertion sort:
  // a row has one or two; an edge meets each partner once, so the keys differ).
  const { nOv, ovRow, ovPartner, ovList, ovStart } = T;
  for (let r = 0; r <= m; r++) ovStart[r] = 0;
  for (let e = 0; e < nOv; e++) ovStart[ovRow[e] + 1]++;
  for (let r = 0; r < m; r++) ovStart[r + 1] += ovStart[r];
  // ovStart[r] is used as row r's fill point, then shifted back to its start.
  for (let e = 0; e < nOv; e++) ovList[ovStart[ovRow[e]]++] = e;
  for (let r = m; r > 0; r--) ovStart[r] = ovStart[r - 1];
  ovStart[0] = 0;
  for (let r = 0; r < m; r++) {
    const lo = ovStart[r], hi = ovStart[r + 1];
    for (let i = lo + 1; i < hi; i++) {
      const o = ovList[i];
      const or = ovPartner[o];
      let j = i - 1;
      while (j >= lo && (x0[ovPartner[ovList[j]]] > x0[or] || (x0[ovPartner[ovList[j]]] === x0[or] && ovPartner[ovList[j]] > or))) {
        ovList[j + 1] = ovList[j];
        j--;
      }
      ovList[j + 1] = o;
    }
  }
}

/**
 * Sort the indexes order[0 … n − 1] by (key[i], i): by key, ties by index. The keys are finite (plan
 * coordinates), so this is a strict total order and any correct sort gives the one result; this one
 * replaces TypedArray.prototype.sort with a comparator, which calls the comparator through the runtime and
 * was a tenth of the overlap search. Insertion sort for short lists, else a bottom-up merge sort through
 * `tmp` (as long as `order`).
 */
function sortByKey(order: Int32Array, tmp: Int32Array, key: Float64Array, n: number): void {
  if (n <= 24) {
    for (let i = 1; i < n; i++) {
      const x = order[i];
      const kx = key[x];
      let j = i - 1;
      while (j >= 0 && (key[order[j]] > kx || (key[order[j]] === kx && order[j] > x))) {
        order[j + 1] = order[j];
        j--;
      }
      order[j + 1] = x;
    }
    return;
  }
  let src = order;
  let dst = tmp;
  for (let width = 1; width < n; width *= 2) {
    for (let lo = 0; lo < n; lo += 2 * width) {
      const mid = Math.min(lo + width, n);
      const hi = Math.min(lo + 2 * width, n);
      let i = lo, j = mid, k = lo;
      while (i < mid && j < hi) {
        const a = src[i], b = src[j];
        // Take from the right run only when it is strictly before (by key, then index).
        if (key[b] < key[a] || (key[b] === key[a] && b < a)) {
          dst[k++] = b;
          j++;
        } else {
          dst[k++] = a;
          i++;
        }
      }
      while (i < mid) dst[k++] = src[i++];
      while (j < hi) dst[k++] = src[j++];
    }
    const t = src;
    src = dst;
    dst = t;
  }
  if (src !== order) order.set(src.subarray(0, n));
}

/**
 * Compare edge rows c and o (o before c in the sweep order, both longer than TOL, different planes):
 * when their boxes overlap, both lie on one line (each end within TOL of the other edge's line) and they
 * share more than TOL of it, add the overlap to both edges' lists.
 */
function overlapPair(c: number, o: number): void {
  const { ax, ay, bx, by, dx, dy, hyp, len, x0, x1, y0, y1 } = table;
  // Box overlap (o starts no later than c in x).
  if (x1[o] < x0[c] || y1[o] < y0[c] || y1[c] < y0[o]) return;
  const cax = ax[c], cay = ay[c], cdx = dx[c], cdy = dy[c], chyp = hyp[c];
  // Distance of a point from a line = |cross product| / length.
  if (Math.abs((ax[o] - cax) * cdy - (ay[o] - cay) * cdx) / chyp > TOL) return;
  if (Math.abs((bx[o] - cax) * cdy - (by[o] - cay) * cdx) / chyp > TOL) return;
  const oax = ax[o], oay = ay[o], odx = dx[o], ody = dy[o], ohyp = hyp[o];
  if (Math.abs((cax - oax) * ody - (cay - oay) * odx) / ohyp > TOL) return;
  if (Math.abs((bx[c] - oax) * ody - (by[c] - oay) * odx) / ohyp > TOL) return;
  // The other edge's ends as distances along this one, clamped to it.
  const u0 = ((oax - cax) * cdx + (oay - cay) * cdy) / chyp;
  const u1 = ((bx[o] - cax) * cdx + (by[o] - cay) * cdy) / chyp;
  const lenA = len[c];
  const lo = Math.max(0, Math.min(u0, u1));
  const hi = Math.min(lenA, Math.max(u0, u1));
  if (hi - lo <= TOL) return;
  table.addOv(c, lo, hi, o);
  // The overlap's end points on this edge, as distances along the other one.
  const pax = cax + (cdx * lo) / lenA, pay = cay + (cdy * lo) / lenA;
  const pbx = cax + (cdx * hi) / lenA, pby = cay + (cdy * hi) / lenA;
  const w0 = ((pax - oax) * odx + (pay - oay) * ody) / ohyp;
  const w1 = ((pbx - oax) * odx + (pby - oay) * ody) / ohyp;
  table.addOv(o, Math.max(0, Math.min(w0, w1)), Math.min(len[o], Math.max(w0, w1)), c);
}

/** Which way a plane goes from an edge: falls, level or rises. */
const FALLS = -1;
const LEVEL = 0;
const RISES = 1;

/**
 * Does the plane rise or fall from an edge? The height of a point 0.1 ft into the plane (perpendicular to
 * the edge, from its midpoint) against the edge's: on a planar surface that is (probe · up) × p/12.
 */
function side(g: PlaneGeometry, edgeFrom: Pt, edgeTo: Pt): number {
  const ex = edgeTo[0] - edgeFrom[0];
  const ey = edgeTo[1] - edgeFrom[1];
  const len = Math.sqrt(ex * ex + ey * ey) || 1;
  const dx = (edgeTo[0] - edgeFrom[0]) / len;
  const dy = (edgeTo[1] - edgeFrom[1]) / len;
  // inward normal: left of the edge for a counter-clockwise outline, right for clockwise
  const nx = g.winding === "ccw" ? -dy : dy;
  const ny = g.winding === "ccw" ? dx : -dx;
  // Height change over the probe distance along the inward normal: (probe · up) × p/12.
  const dz = (EDGE_PROBE_FT * (nx * g.up[0] + ny * g.up[1]) * g.pitch) / 12;
  return dz < -1e-9 ? FALLS : dz > 1e-9 ? RISES : LEVEL;
}

function typeShared(horizontal: boolean, a: number, b: number): EdgeType {
  if (horizontal) {
    if (a === FALLS && b === FALLS) return "ridge";
    if (a === RISES && b === RISES) return "valley";
    return "transition";
  }
  if (a === FALLS && b === FALLS) return "hip";
  if (a === RISES && b === RISES) return "valley";
  return "transition";
}

function typeUnshared(horizontal: boolean, s: number): EdgeType {
  if (!horizontal) return "rake";
  return s === FALLS ? "headwall" : "eave";
}

export interface EdgeAnalysis {
  /** Pieces per plane, in edge order. */
  byPlane: EdgePiece[][];
  totals: EdgeTotals;
  runs: EdgeRun[];
  advisories: Advisory[];
}

/**
 * Cut points along the edge being split: `cuts` holds 2 + 2 × (its overlap count) of them, then the ones
 * kept (apart by more than TOL) are moved to its front. Reused: one edge is split at a time. Grown when an
 * edge has more overlaps than ever before.
 */
let cuts = new Float64Array(16);

/**
 * The point `t` along the edge from a to b (of length len), a + (b − a)·t ∕ len per coordinate. When those
 * numbers are the very ones of `a` or of `b` (a piece starting or ending at the edge's corner mostly gives
 * them), that corner's pair itself rather than a copy: the same numbers, as unsplit pieces already share
 * their edge's corner pairs.
 */
function pointAlong(a: Pt, b: Pt, t: number, len: number): Pt {
  const x = a[0] + ((b[0] - a[0]) * t) / len;
  const y = a[1] + ((b[1] - a[1]) * t) / len;
  // Object.is, not ===: +0 and −0 are different numbers here (a −0 corner plus 0 gives +0).
  if (Object.is(x, a[0]) && Object.is(y, a[1])) return a;
  if (Object.is(x, b[0]) && Object.is(y, b[1])) return b;
  return [x, y];
}

/**
 * One plane's pieces are gathered here, then copied out with slice() at their exact count (push from []
 * reserves room for 17 at once; a plane has a handful). Entries past the current plane's are left over.
 */
const planePieces: EdgePiece[] = [];

/**
 * Split and type the edges of all planes. `overrides(planeIdx, edgeIndex)` gives the user's type for an
 * edge, if any; on a shared piece the override of the plane that comes first wins, then the other's.
 * Takes the planes as `planeGeometry` builds them: `edges[i].index === i`, and `planLengthFt` is
 * Math.hypot of the edge's plan vector. The tables here are shared by every call, so `overrides` must not
 * call analyseEdges or buildRuns itself.
 */
export function analyseEdges(
  planes: PlaneGeometry[],
  overrides: Overrides = () => undefined,
  /** How the advisories name plane p (its name, see planeLabels); its id when not given. */
  labelOf: (p: number) => string = (p) => planes[p].id,
): EdgeAnalysis {
  const nPlanes = planes.length;
  const T = table;
  // First edge row of each plane in the edge table, and each edge's side (falls / level / rises).
  let m = 0;
  for (let p = 0; p < nPlanes; p++) m += planes[p].edges.length;
  T.reserve(m, nPlanes);
  const { rowStart, sides } = T;
  rowStart[0] = 0;
  for (let p = 0; p < nPlanes; p++) rowStart[p + 1] = rowStart[p] + planes[p].edges.length;
  for (let p = 0, r = 0; p < nPlanes; p++) {
    const g = planes[p];
    const edges = g.edges;
    for (let k = 0; k < edges.length; k++) sides[r++] = side(g, edges[k].from, edges[k].to);
  }
  findOverlaps(planes);
  const { ovList, ovStart, ovT0, ovT1, ovPartner, plane: planeOfRow, edge: edgeOfRow } = T;
  const byPlane: EdgePiece[][] = [];
  const advisories: Advisory[] = [];
  // Plane pairs already warned about, as lo × nPlanes + hi (made on the first warning: most roofs have none).
  let mismatch: Set<number> | null = null;
  const totals = zeroTotals();

  for (let p = 0; p < nPlanes; p++) {
    const g = planes[p];
    // heightAt(g, ·) written out below with the very operations of heightAt, so the very numbers: it is not
    // always inlined, and a call that is not returns each height as a new boxed number.
    const gox = g.origin[0], goy = g.origin[1], gux = g.up[0], guy = g.up[1], gBase = g.baseElevationFt, gPitch = g.pitch;
    const pieces = planePieces;
    let nPieces = 0;
    const edges = g.edges;
    for (let k = 0; k < edges.length; k++) {
      const ed = edges[k];
      const row = rowStart[p] + k;
      const mine = sides[row];
      const len = ed.planLengthFt;
      // This edge's overlaps: ovList[ov0] … ovList[ov1 − 1].
      const ov0 = ovStart[row];
      const ov1 = ovStart[row + 1];
      if (ov0 === ov1) {
        const horizontal = Math.abs(ed.z1 - ed.z0) <= TOL;
        const computedType = typeUnshared(horizontal, mine);
        const over = overrides(p, ed.index);
        const type = over ?? computedType;
        putItem(pieces, nPieces++, {
          planeIdx: p,
          planeId: g.id,
          edgeIndex: ed.index,
          part: 0,
          from: ed.from,
          to: ed.to,
          planLengthFt: len,
          trueLengthFt: ed.trueLengthFt,
          z0: ed.z0,
          z1: ed.z1,
          horizontal,
          shared: false,
          partner: null,
          computedType,
          type,
          overridden: over !== undefined,
          counted: true,
        });
        addToTotals(totals, type, ed.trueLengthFt);
        continue;
      }
      // Cut the edge at 0, len and both ends of every overlap, sorted (insertion sort: a handful of
      // numbers), merging cuts closer than TOL to the last one kept.
      const nc = 2 + 2 * (ov1 - ov0);
      if (cuts.length < nc) cuts = new Float64Array(nc * 2);
      cuts[0] = 0;
      cuts[1] = len;
      for (let i = ov0, c = 2; i < ov1; i++, c += 2) {
        cuts[c] = ovT0[ovList[i]];
        cuts[c + 1] = ovT1[ovList[i]];
      }
      sortPrefix(cuts, nc);
      let nu = 1;
      for (let i = 1; i < nc; i++) if (cuts[i] - cuts[nu - 1] > TOL) cuts[nu++] = cuts[i];
      if (len - cuts[nu - 1] > 0) cuts[nu - 1] = len;
      cuts[0] = 0;
      let part = 0;
      for (let i = 0; i + 1 < nu; i++) {
        const t0 = cuts[i];
        const t1 = cuts[i + 1];
        const tm = (t0 + t1) / 2;
        // The piece is shared with the first overlap that holds its midpoint (an entry, or −1).
        let partner = -1;
        for (let j = ov0; j < ov1; j++) {
          const e = ovList[j];
          if (ovT0[e] - 1e-9 <= tm && tm <= ovT1[e] + 1e-9) {
            partner = e;
            break;
          }
        }
        const from = pointAlong(ed.from, ed.to, t0, len);
        const to = pointAlong(ed.from, ed.to, t1, len);
        const z0 = gBase + (((from[0] - gox) * gux + (from[1] - goy) * guy) * gPitch) / 12;
        const z1 = gBase + (((to[0] - gox) * gux + (to[1] - goy) * guy) * gPitch) / 12;
        const plan = t1 - t0;
        // A piece that is its whole edge (the usual shared edge) has the edge's own numbers: the edge's true
        // length is that very hypot2 (planeGeometry), as the unshared pieces above take it.
        const trueLengthFt = plan === len && z0 === ed.z0 && z1 === ed.z1 ? ed.trueLengthFt : hypot2(plan, z1 - z0);
        const horizontal = Math.abs(z1 - z0) <= TOL;
        // A piece along no other plane is typed from this plane alone; a shared one from both, and counted
        // (and checked for a height mismatch) on the plane that comes first.
        let computedType: EdgeType;
        let over: EdgeType | undefined;
        let q: PlaneGeometry | null = null;
        let qi = -1;
        let qEdge = -1;
        let first = true;
        // The partner plane's heights at the piece's ends (heightAt(q, ·) written out, as above).
        let qz0 = 0;
        let qz1 = 0;
        if (partner === -1) {
          computedType = typeUnshared(horizontal, mine);
          over = overrides(p, ed.index);
        } else {
          const partnerRow = ovPartner[partner];
          qi = planeOfRow[partnerRow];
          qEdge = edgeOfRow[partnerRow];
          q = planes[qi];
          const theirs = sides[partnerRow];
          first = p < qi;
          const qox = q.origin[0], qoy = q.origin[1], qux = q.up[0], quy = q.up[1];
          qz0 = q.baseElevationFt + (((from[0] - qox) * qux + (from[1] - qoy) * quy) * q.pitch) / 12;
          qz1 = q.baseElevationFt + (((to[0] - qox) * qux + (to[1] - qoy) * quy) * q.pitch) / 12;
          // Type from the first plane's view of horizontality so both sides agree.
          const horizontalForType = first ? horizontal : Math.abs(qz0 - qz1) <= TOL;
          computedType = typeShared(horizontalForType, mine, theirs);
          over = first ? overrides(p, ed.index) ?? overrides(qi, qEdge) : overrides(qi, qEdge) ?? overrides(p, ed.index);
        }
        const type = over ?? computedType;
        putItem(pieces, nPieces++, {
          planeIdx: p,
          planeId: g.id,
          edgeIndex: ed.index,
          part: part++,
          from,
          to,
          planLengthFt: plan,
          trueLengthFt,
          z0,
          z1,
          horizontal,
          shared: q !== null,
          partner: q !== null ? { planeIdx: qi, planeId: q.id, edgeIndex: qEdge } : null,
          computedType,
          type,
          overridden: over !== undefined,
          counted: first,
        });
        if (!first) continue;
        addToTotals(totals, type, trueLengthFt);
        if (q === null) continue;
        const d0 = Math.abs(qz0 - z0);
        const d1 = Math.abs(qz1 - z1);
        const key = p * nPlanes + qi;
        if (Math.max(d0, d1) > HEIGHT_MISMATCH_FT && !(mismatch !== null && mismatch.has(key))) {
          if (mismatch === null) mismatch = new Set<number>();
          mismatch.add(key);
          advisories.push(
            advisory(
              "shared-edge-height-mismatch",
              "warning",
              `Planes ${labelOf(p)} and ${labelOf(qi)} meet along an edge but their heights there differ by up to ${Math.max(d0, d1).toFixed(2)} ft. Check the pitches, eave edges and base elevations: the edge type and lengths may be wrong.`,
              "common practice",
              [g.id, q.id],
            ),
          );
        }
      }
    }
    byPlane.push(pieces.slice(0, nPieces));
  }

  return { byPlane, totals, runs: buildRuns(byPlane), advisories };
}

/**
 * Stores `v` at `i` of one of this file's scratch lists of objects and strings (i ≤ its length: stored, or
 * pushed at the end; see ../scratch-list). Its own function, so that its store only meets these lists.
 */
function putItem<T>(list: T[], i: number, v: T): void {
  if (i < list.length) list[i] = v;
  else list.push(v);
}

/** A small number per edge type (8 for anything else), so pieces' types compare as integers. */
function typeCode(t: EdgeType): number {
  switch (t) {
    case "eave": return 0;
    case "rake": return 1;
    case "ridge": return 2;
    case "hip": return 3;
    case "valley": return 4;
    case "transition": return 5;
    case "sidewall": return 6;
    case "headwall": return 7;
  }
  return 8;
}

/**
 * Scratch for buildRuns, grown as needed and reused (buildRuns calls nothing that could re-enter it).
 * Per piece: its ends (from x, y, to x, y), unit 3D direction, type code and union-find parent. A hash from
 * grid cell to the piece ends in it, open addressing over typed arrays (a Map of arrays costs an allocation
 * per cell): `cellKey[s]` is the cell in slot s (−1 empty), `cellHead[s]` its first end, and `nextEnd[e]`
 * the end after e in the same cell. End e is end (e & 1) of piece e >> 1.
 */
class RunScratch {
  ends = new Float64Array(0);
  dir = new Float64Array(0);
  type = new Int8Array(0);
  parent = new Int32Array(0);
  nextEnd = new Int32Array(0);
  cellKey = new Int32Array(0);
  cellHead = new Int32Array(0);
  /** Per root piece its group number (−1: none yet); per piece its group; per group its size and start. */
  groupOfRoot = new Int32Array(0);
  group = new Int32Array(0);
  groupSize = new Int32Array(0);
  groupStart = new Int32Array(0);
  /**
   * The counted pieces, then the same pieces grouped (group by group, input order within each), the plane
   * ids of one run and the runs: lists the results are copied out of with slice(), which makes an array
   * exactly as long as its contents (push from [] reserves room for 17 entries at once, and most runs hold
   * one piece and one or two ids). Entries past the current roof's are left from earlier calls.
   */
  pieces: EdgePiece[] = [];
  grouped: EdgePiece[] = [];
  ids: string[] = [];
  runs: EdgeRun[] = [];
  bits = 0;

  reserve(n: number): void {
    if (this.parent.length < n) {
      const c = Math.max(n, this.parent.length * 2, 64);
      this.ends = new Float64Array(c * 4);
      this.dir = new Float64Array(c * 3);
      this.type = new Int8Array(c);
      this.parent = new Int32Array(c);
      this.nextEnd = new Int32Array(c * 2);
      this.groupOfRoot = new Int32Array(c);
      this.group = new Int32Array(c);
      this.groupSize = new Int32Array(c);
      this.groupStart = new Int32Array(c);
    }
    // At most 2n cells; keep the table at most a quarter full so probes stay short.
    let bits = 6;
    while (1 << bits < n * 8) bits++;
    if (bits > this.bits) {
      this.bits = bits;
      this.cellKey = new Int32Array(1 << bits);
      this.cellHead = new Int32Array(1 << bits);
    }
    this.cellKey.fill(-1);
  }

  /** Slot of a cell key: its own, or the empty one where it would go (Fibonacci hashing, linear probing). */
  slot(key: number): number {
    const mask = (1 << this.bits) - 1;
    let s = Math.imul(key, 0x9e3779b1) >>> (32 - this.bits);
    while (this.cellKey[s] !== -1 && this.cellKey[s] !== key) s = (s + 1) & mask;
    return s;
  }
}
const runScratch = new RunScratch();

/**
 * Join counted pieces of the same type that meet end to end on one straight line into runs (one ridge
 * line, one eave). Endpoints are matched through a grid hash, so this is linear in the piece count.
 * The runs are the connected groups of the "touches and is collinear" relation, so the order pairs are
 * found in does not matter; runs come in the order of their first piece, pieces in input order.
 */
export function buildRuns(byPlane: EdgePiece[][]): EdgeRun[] {
  const S = runScratch;
  const pieces = S.pieces;
  let n = 0;
  for (let k = 0; k < byPlane.length; k++) {
    const ps = byPlane[k];
    for (let i = 0; i < ps.length; i++) if (ps[i].counted) putItem(pieces, n++, ps[i]);
  }
  S.reserve(n);
  const { ends, dir, type, parent, nextEnd, cellKey, cellHead } = S;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    const p = pieces[i];
    const fx = p.from[0], fy = p.from[1], tx = p.to[0], ty = p.to[1];
    ends[i * 4] = fx;
    ends[i * 4 + 1] = fy;
    ends[i * 4 + 2] = tx;
    ends[i * 4 + 3] = ty;
    maxAbs = Math.max(maxAbs, Math.abs(fx), Math.abs(fy), Math.abs(tx), Math.abs(ty));
    type[i] = typeCode(p.type);
    parent[i] = i;
    // 3D directions: two rakes meeting at a gable's apex are parallel in plan but not one straight line.
    const dx = tx - fx;
    const dy = ty - fy;
    const dz = p.z1 - p.z0;
    const l = Math.sqrt(dx * dx + dy * dy + dz * dz) || 1;
    dir[i * 3] = dx / l;
    dir[i * 3 + 1] = dy / l;
    dir[i * 3 + 2] = dz / l;
  }
  // Square cells at least 25 × TOL wide, and few enough that the key (cx + 8192) × 16384 + (cy + 8192) stays
  // a small integer (|cx|, |cy| ≤ 4001, so below 2^28: an int32). An end within TOL of another is then in the
  // same cell or, when it is within `near` (in cell widths) of a side, possibly in the cell beyond that side:
  // any point of that cell is at least `near` cell widths, 1.2 × TOL, away. Wide cells make that rare (a
  // corner lies in one cell, seldom two), and the ends of a cell are far fewer than the cell lookups saved.
  // The cells only choose which pairs are compared (every pair within TOL is); the runs do not depend on them.
  const size = Math.max(25 * TOL, maxAbs / 4000);
  const near = (1.2 * TOL) / size;
  const far = 1 - near;
  // Pieces from last to first: each end is matched against the ends already in the hash, then goes in
  // itself (so every pair of pieces meets once, the later piece's ends being in; a piece's first end is in
  // when its second is matched, hence the j === i skip).
  for (let i = n - 1; i >= 0; i--) {
    const ti = type[i];
    const ax = dir[i * 3], ay = dir[i * 3 + 1], az = dir[i * 3 + 2];
    for (let e = 0; e < 2; e++) {
      const qx = ends[i * 4 + e * 2];
      const qy = ends[i * 4 + e * 2 + 1];
      const gx = qx / size;
      const gy = qy / size;
      const cx = Math.floor(gx);
      const cy = Math.floor(gy);
      const fx = gx - cx;
      const fy = gy - cy;
      const ox0 = fx < near ? -1 : 0;
      const ox1 = fx > far ? 1 : 0;
      const oy0 = fy < near ? -1 : 0;
      const oy1 = fy > far ? 1 : 0;
      for (let ox = ox0; ox <= ox1; ox++)
        for (let oy = oy0; oy <= oy1; oy++) {
          const s = S.slot((cx + ox + 8192) * 16384 + (cy + oy + 8192));
          if (cellKey[s] === -1) continue;
          for (let end = cellHead[s]; end !== -1; end = nextEnd[end]) {
            const j = end >> 1;
            if (j === i || type[j] !== ti) continue;
            // (Code 8 is any name outside EdgeType, which the input schema rules out: compare the names.)
            if (ti === 8 && pieces[j].type !== pieces[i].type) continue;
            const f0 = ends[j * 4] - qx, f1 = ends[j * 4 + 1] - qy, t0 = ends[j * 4 + 2] - qx, t1 = ends[j * 4 + 3] - qy;
            const touches = f0 * f0 + f1 * f1 <= TOL * TOL || t0 * t0 + t1 * t1 <= TOL * TOL;
            if (!touches) continue;
            const bx = dir[j * 3], by = dir[j * 3 + 1], bz = dir[j * 3 + 2];
            const c1 = ay * bz - az * by, c2 = az * bx - ax * bz, c3 = ax * by - ay * bx;
            const c = Math.sqrt(c1 * c1 + c2 * c2 + c3 * c3);
            if (c <= 1e-3) parent[findRoot(parent, i)] = findRoot(parent, j);
          }
        }
      // This end into its own cell.
      const k = (cx + 8192) * 16384 + (cy + 8192);
      const s = S.slot(k);
      const end = i * 2 + e;
      if (cellKey[s] === -1) {
        cellKey[s] = k;
        nextEnd[end] = -1;
      } else nextEnd[end] = cellHead[s];
      cellHead[s] = end;
    }
  }
  // Groups by root, numbered in the order their first piece comes; then the pieces placed group by group
  // (a counting sort: input order within each group).
  const { groupOfRoot, group, groupSize, groupStart, grouped, ids, runs } = S;
  for (let i = 0; i < n; i++) groupOfRoot[i] = -1;
  let nGroups = 0;
  for (let i = 0; i < n; i++) {
    const r = findRoot(parent, i);
    let g = groupOfRoot[r];
    if (g === -1) {
      g = groupOfRoot[r] = nGroups++;
      groupSize[g] = 0;
    }
    group[i] = g;
    groupSize[g]++;
  }
  for (let g = 0, at = 0; g < nGroups; g++) {
    groupStart[g] = at;
    at += groupSize[g];
  }
  // `grouped` is written at any index below n: first make it that long (packed), with any piece.
  while (grouped.length < n) grouped.push(pieces[0]);
  for (let i = 0; i < n; i++) grouped[groupStart[group[i]]++] = pieces[i];
  // groupStart[g] is now the end of group g.
  for (let g = 0; g < nGroups; g++) {
    const end = groupStart[g];
    const start = end - groupSize[g];
    const p0 = grouped[start];
    if (end - start === 1) {
      // A run of one piece (most runs): its lists as literals, the same arrays slice() makes below (packed,
      // exactly as long as their contents), without the calls.
      const other = p0.partner;
      const planeIds = other && other.planeId !== p0.planeId ? [p0.planeId, other.planeId] : [p0.planeId];
      putItem(runs, g, { type: p0.type, lengthFt: 0 + p0.trueLengthFt, planLengthFt: 0 + p0.planLengthFt, planeIds, pieces: [p0] });
      continue;
    }
    let nIds = 0;
    let len = 0;
    let plan = 0;
    for (let i = start; i < end; i++) {
      const p = grouped[i];
      nIds = addId(ids, nIds, p.planeId);
      if (p.partner) nIds = addId(ids, nIds, p.partner.planeId);
      len += p.trueLengthFt;
      plan += p.planLengthFt;
    }
    putItem(runs, g, { type: p0.type, lengthFt: len, planLengthFt: plan, planeIds: ids.slice(0, nIds), pieces: grouped.slice(start, end) });
  }
  return runs.slice(0, nGroups);
}

/** Root of piece i's set (union-find with path halving). */
function findRoot(parent: Int32Array, i: number): number {
  while (parent[i] !== i) {
    parent[i] = parent[parent[i]];
    i = parent[i];
  }
  return i;
}

/**
 * Add a plane id to the first `nIds` entries of `ids` unless they have it (a plain loop: a run touches one or
 * a few planes); returns the new count.
 */
function addId(ids: string[], nIds: number, id: string): number {
  for (let i = 0; i < nIds; i++) if (ids[i] === id) return nIds;
  putItem(ids, nIds, id);
  return nIds + 1;
}

/** Find the piece of a plane's edge that contains a plan point (nearest along the edge). */
export function pieceAt(pieces: EdgePiece[], edgeIndex: number, p: Pt): EdgePiece | undefined {
  let best: EdgePiece | undefined;
  let bestD = Infinity;
  for (const pc of pieces) {
    if (pc.edgeIndex !== edgeIndex) continue;
    const len = Math.hypot(pc.to[0] - pc.from[0], pc.to[1] - pc.from[1]);
    const t = param(p, pc.from, pc.to);
    const d = t < 0 ? -t : t > len ? t - len : 0;
    if (d < bestD) {
      bestD = d;
      best = pc;
    }
  }
  return best;
}
