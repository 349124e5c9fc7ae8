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
import { heightAt, hypot2, type PlaneGeometry } from "./geometry";
import type { Pt } from "./polygon";

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

interface Overlap {
  t0: number;
  t1: number;
  planeIdx: number;
  edgeIndex: number;
  /** The partner edge's row in the edge table. */
  row: number;
}

type Overrides = (planeIdx: number, edgeIndex: number) => EdgeType | undefined;

const param = (p: Pt, a: Pt, b: Pt) => {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  return ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len;
};

const lerp = (a: Pt, b: Pt, t: number, len: number): Pt => [a[0] + ((b[0] - a[0]) * t) / len, a[1] + ((b[1] - a[1]) * t) / len];

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
  /** Plane indexes sorted by px0, then the sweep's active planes. */
  planeOrder = new Int32Array(0);
  planeActive = new Int32Array(0);

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
    }
    if (planes > this.px0.length) {
      const c = Math.max(planes, this.px0.length * 2, 16);
      this.px0 = new Float64Array(c);
      this.px1 = new Float64Array(c);
      this.py0 = new Float64Array(c);
      this.py1 = new Float64Array(c);
      this.planeOrder = new Int32Array(c);
      this.planeActive = new Int32Array(c);
    }
  }
}
const table = new EdgeTable();

/**
 * Find collinear overlaps between edges of different planes. Returns, per row of the edge table, that
 * edge's overlaps or null.
 *
 * The results are defined by a sweep over all edges sorted by x0 (ties in input order): an edge is
 * compared with each earlier one whose box overlaps its own, and each overlap is worked out from the line
 * of the later edge of the two (`cur`) first, the other edge's interval from the first one's end points;
 * so each edge's list comes in the sweep order of its partners. Sorting every edge costs more than the rest
 * of the search, so this finds the same pairs another way: planes whose boxes overlap (a sweep over the far
 * fewer planes), then their edges pairwise; which edge of a pair is `cur` comes from comparing the two
 * edges' sort keys, and each edge's (short) list is put in its partners' sweep order at the end.
 */
function findOverlaps(planes: PlaneGeometry[], rowStart: Int32Array): (Overlap[] | null)[] {
  const T = table;
  const nPlanes = planes.length;
  const m = rowStart[nPlanes];
  T.reserve(m, nPlanes);
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
  planeOrder.subarray(0, nPlanes).sort((i, j) => px0[i] - px0[j] || i - j);

  const out: (Overlap[] | null)[] = new Array(m).fill(null);
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
      for (let i = rowStart[c]; i < rowStart[c + 1]; i++) {
        // An edge no longer than TOL overlaps nothing.
        if (len[i] <= TOL) continue;
        for (let j = rowStart[o]; j < rowStart[o + 1]; j++) {
          if (len[j] <= TOL) continue;
          // The later of the two in the sweep order is `cur`.
          if (x0[i] < x0[j] || (x0[i] === x0[j] && i < j)) overlapPair(j, i, out);
          else overlapPair(i, j, out);
        }
      }
    }
    planeActive[nActive++] = c;
  }
  // Each list in its partners' sweep order (insertion sort: lists hold one or two overlaps).
  for (let r = 0; r < m; r++) {
    const l = out[r];
    if (l === null || l.length < 2) continue;
    for (let i = 1; i < l.length; i++) {
      const o = l[i];
      let j = i - 1;
      while (j >= 0 && (x0[l[j].row] > x0[o.row] || (x0[l[j].row] === x0[o.row] && l[j].row > o.row))) {
        l[j + 1] = l[j];
        j--;
      }
      l[j + 1] = o;
    }
  }
  return out;
}

/**
 * Compare edge rows c and o (o before c in the sweep order, both longer than TOL, different planes):
 * when their boxes overlap, both lie on one line (each end within TOL of the other edge's line) and they
 * share more than TOL of it, add the overlap to both edges' lists.
 */
function overlapPair(c: number, o: number, out: (Overlap[] | null)[]): void {
  const { ax, ay, bx, by, dx, dy, hyp, len, x0, x1, y0, y1, plane, edge } = table;
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
  push(out, c, { t0: lo, t1: hi, planeIdx: plane[o], edgeIndex: edge[o], row: o });
  // The overlap's end points on this edge, as distances along the other one.
  const pax = cax + (cdx * lo) / lenA, pay = cay + (cdy * lo) / lenA;
  const pbx = cax + (cdx * hi) / lenA, pby = cay + (cdy * hi) / lenA;
  const w0 = ((pax - oax) * odx + (pay - oay) * ody) / ohyp;
  const w1 = ((pbx - oax) * odx + (pby - oay) * ody) / ohyp;
  push(out, o, { t0: Math.max(0, Math.min(w0, w1)), t1: Math.min(len[o], Math.max(w0, w1)), planeIdx: plane[c], edgeIndex: edge[c], row: c });
}

function push(out: (Overlap[] | null)[], row: number, o: Overlap): void {
  const l = out[row];
  if (l) l.push(o);
  else out[row] = [o];
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
 * Split and type the edges of all planes. `overrides(planeIdx, edgeIndex)` gives the user's type for an
 * edge, if any; on a shared piece the override of the plane that comes first wins, then the other's.
 * Takes the planes as `planeGeometry` builds them: `edges[i].index === i`, and `planLengthFt` is
 * Math.hypot of the edge's plan vector.
 */
export function analyseEdges(planes: PlaneGeometry[], overrides: Overrides = () => undefined): EdgeAnalysis {
  const nPlanes = planes.length;
  // First edge row of each plane in the edge table, and each edge's side (falls / level / rises).
  const rowStart = new Int32Array(nPlanes + 1);
  for (let p = 0; p < nPlanes; p++) rowStart[p + 1] = rowStart[p] + planes[p].edges.length;
  const m = rowStart[nPlanes];
  const sides = new Int8Array(m);
  for (let p = 0, r = 0; p < nPlanes; p++) {
    const g = planes[p];
    for (const ed of g.edges) sides[r++] = side(g, ed.from, ed.to);
  }
  const overlaps = findOverlaps(planes, rowStart);
  const byPlane: EdgePiece[][] = [];
  const advisories: Advisory[] = [];
  // Plane pairs already warned about, as lo × nPlanes + hi.
  const mismatch = new Set<number>();
  const totals = zeroTotals();

  for (let p = 0; p < nPlanes; p++) {
    const g = planes[p];
    const pieces: EdgePiece[] = [];
    byPlane.push(pieces);
    const edges = g.edges;
    for (let k = 0; k < edges.length; k++) {
      const ed = edges[k];
      const mine = sides[rowStart[p] + k];
      const len = ed.planLengthFt;
      const ov = overlaps[rowStart[p] + k];
      if (ov === null) {
        const horizontal = Math.abs(ed.z1 - ed.z0) <= TOL;
        const computedType = typeUnshared(horizontal, mine);
        const over = overrides(p, ed.index);
        const type = over ?? computedType;
        pieces.push({
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
      const nc = 2 + 2 * ov.length;
      if (cuts.length < nc) cuts = new Float64Array(nc * 2);
      cuts[0] = 0;
      cuts[1] = len;
      for (let i = 0; i < ov.length; i++) {
        cuts[2 + 2 * i] = ov[i].t0;
        cuts[3 + 2 * i] = ov[i].t1;
      }
      for (let i = 1; i < nc; i++) {
        const x = cuts[i];
        let j = i - 1;
        while (j >= 0 && cuts[j] > x) {
          cuts[j + 1] = cuts[j];
          j--;
        }
        cuts[j + 1] = x;
      }
      let nu = 1;
      for (let i = 1; i < nc; i++) if (cuts[i] - cuts[nu - 1] > TOL) cuts[nu++] = cuts[i];
      if (len - cuts[nu - 1] > 0) cuts[nu - 1] = len;
      cuts[0] = 0;
      let part = 0;
      for (let i = 0; i + 1 < nu; i++) {
        const t0 = cuts[i];
        const t1 = cuts[i + 1];
        const tm = (t0 + t1) / 2;
        // The piece is shared with the first overlap that holds its midpoint.
        let partner: Overlap | null = null;
        for (let j = 0; j < ov.length && !partner; j++) if (ov[j].t0 - 1e-9 <= tm && tm <= ov[j].t1 + 1e-9) partner = ov[j];
        const from = lerp(ed.from, ed.to, t0, len);
        const to = lerp(ed.from, ed.to, t1, len);
        const z0 = heightAt(g, from);
        const z1 = heightAt(g, to);
        const plan = t1 - t0;
        const trueLengthFt = hypot2(plan, z1 - z0);
        const horizontal = Math.abs(z1 - z0) <= TOL;
        if (partner === null) {
          const computedType = typeUnshared(horizontal, mine);
          const over = overrides(p, ed.index);
          const type = over ?? computedType;
          pieces.push({
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
            shared: false,
            partner: null,
            computedType,
            type,
            overridden: over !== undefined,
            counted: true,
          });
          addToTotals(totals, type, trueLengthFt);
          continue;
        }
        const qi = partner.planeIdx;
        const q = planes[qi];
        const theirs = sides[partner.row];
        const first = p < qi;
        // Type from the first plane's view of horizontality so both sides agree.
        const horizontalForType = first ? horizontal : Math.abs(heightAt(q, from) - heightAt(q, to)) <= TOL;
        const computedType = typeShared(horizontalForType, mine, theirs);
        const over = first ? overrides(p, ed.index) ?? overrides(qi, partner.edgeIndex) : overrides(qi, partner.edgeIndex) ?? overrides(p, ed.index);
        const type = over ?? computedType;
        pieces.push({
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
          shared: true,
          partner: { planeIdx: qi, planeId: q.id, edgeIndex: partner.edgeIndex },
          computedType,
          type,
          overridden: over !== undefined,
          counted: first,
        });
        if (!first) continue;
        addToTotals(totals, type, trueLengthFt);
        const d0 = Math.abs(heightAt(q, from) - z0);
        const d1 = Math.abs(heightAt(q, to) - z1);
        const key = p * nPlanes + qi;
        if (Math.max(d0, d1) > HEIGHT_MISMATCH_FT && !mismatch.has(key)) {
          mismatch.add(key);
          advisories.push(
            advisory(
              "shared-edge-height-mismatch",
              "warning",
              `Planes "${g.id}" and "${q.id}" meet along an edge but their heights there differ by up to ${Math.max(d0, d1).toFixed(2)} ft. Check the pitches, eave edges and base elevations: the edge type and lengths may be wrong.`,
              "common practice",
              [g.id, q.id],
            ),
          );
        }
      }
    }
  }

  return { byPlane, totals, runs: buildRuns(byPlane), advisories };
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
  bits = 0;

  reserve(n: number): void {
    if (this.parent.length < n) {
      const c = Math.max(n, this.parent.length * 2, 64);
      this.ends = new Float64Array(c * 4);
      this.dir = new Float64Array(c * 3);
      this.type = new Int8Array(c);
      this.parent = new Int32Array(c);
      this.nextEnd = new Int32Array(c * 2);
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
  const pieces: EdgePiece[] = [];
  for (const ps of byPlane) for (const p of ps) if (p.counted) pieces.push(p);
  const n = pieces.length;
  const S = runScratch;
  S.reserve(n);
  const { ends, dir, type, parent, nextEnd, cellKey, cellHead } = S;
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    const p = pieces[i];
    ends[i * 4] = p.from[0];
    ends[i * 4 + 1] = p.from[1];
    ends[i * 4 + 2] = p.to[0];
    ends[i * 4 + 3] = p.to[1];
    maxAbs = Math.max(maxAbs, Math.abs(p.from[0]), Math.abs(p.from[1]), Math.abs(p.to[0]), Math.abs(p.to[1]));
    type[i] = typeCode(p.type);
    parent[i] = i;
    // 3D directions: two rakes meeting at a gable's apex are parallel in plan but not one straight line.
    const dx = p.to[0] - p.from[0];
    const dy = p.to[1] - p.from[1];
    const dz = p.z1 - p.z0;
    const l = Math.sqrt(dx * dx + dy * dy + dz * dz) || 1;
    dir[i * 3] = dx / l;
    dir[i * 3 + 1] = dy / l;
    dir[i * 3 + 2] = dz / l;
  }
  // Cells at least 4 × TOL wide (so touching ends are in neighbouring cells), and few enough that the
  // key stays a small integer (below 2^28, so an int32).
  const size = Math.max(4 * TOL, maxAbs / 4000);
  const key = (cx: number, cy: number) => (cx + 8192) * 16384 + (cy + 8192);
  // Pieces from last to first: each is matched against the later pieces already in the hash (every pair
  // once), then its own ends go in.
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
      // A touching end is at most TOL ≤ a quarter cell away: a neighbouring cell only near that side.
      const fx = gx - cx;
      const fy = gy - cy;
      const ox0 = fx < 0.3 ? -1 : 0;
      const ox1 = fx > 0.7 ? 1 : 0;
      const oy0 = fy < 0.3 ? -1 : 0;
      const oy1 = fy > 0.7 ? 1 : 0;
      for (let ox = ox0; ox <= ox1; ox++)
        for (let oy = oy0; oy <= oy1; oy++) {
          const s = S.slot(key(cx + ox, cy + oy));
          if (cellKey[s] === -1) continue;
          for (let end = cellHead[s]; end !== -1; end = nextEnd[end]) {
            const j = end >> 1;
            if (type[j] !== ti) continue;
            // (Code 8 is any name outside EdgeType, which the input schema rules out: compare the names.)
            if (ti === 8 && pieces[j].type !== pieces[i].type) continue;
            const f0 = ends[j * 4] - qx, f1 = ends[j * 4 + 1] - qy, t0 = ends[j * 4 + 2] - qx, t1 = ends[j * 4 + 3] - qy;
            const touches = f0 * f0 + f1 * f1 <= TOL * TOL || t0 * t0 + t1 * t1 <= TOL * TOL;
            if (!touches) continue;
            const bx = dir[j * 3], by = dir[j * 3 + 1], bz = dir[j * 3 + 2];
            const c1 = ay * bz - az * by, c2 = az * bx - ax * bz, c3 = ax * by - ay * bx;
            const c = Math.sqrt(c1 * c1 + c2 * c2 + c3 * c3);
            if (c <= 1e-3) parent[find(i)] = find(j);
          }
        }
    }
    for (let e = 0; e < 2; e++) {
      const k = key(Math.floor(ends[i * 4 + e * 2] / size), Math.floor(ends[i * 4 + e * 2 + 1] / size));
      const s = S.slot(k);
      const end = i * 2 + e;
      if (cellKey[s] === -1) {
        cellKey[s] = k;
        nextEnd[end] = -1;
      } else nextEnd[end] = cellHead[s];
      cellHead[s] = end;
    }
  }
  // Groups by root, in the order their first piece comes.
  const groupOf: EdgePiece[][] = new Array(n);
  const order: EdgePiece[][] = [];
  for (let i = 0; i < n; i++) {
    const r = find(i);
    const g = groupOf[r];
    if (g) g.push(pieces[i]);
    else order.push((groupOf[r] = [pieces[i]]));
  }
  const runs: EdgeRun[] = [];
  for (let k = 0; k < order.length; k++) {
    const g = order[k];
    const ids: string[] = [];
    let len = 0;
    let plan = 0;
    for (let i = 0; i < g.length; i++) {
      const p = g[i];
      addId(ids, p.planeId);
      if (p.partner) addId(ids, p.partner.planeId);
      len += p.trueLengthFt;
      plan += p.planLengthFt;
    }
    runs.push({ type: g[0].type, lengthFt: len, planLengthFt: plan, planeIds: ids, pieces: g });
  }
  return runs;
}

/** Append a plane id unless the list has it (a plain loop: the lists hold one or a few ids). */
function addId(ids: string[], id: string): void {
  for (let i = 0; i < ids.length; i++) if (ids[i] === id) return;
  ids.push(id);
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
