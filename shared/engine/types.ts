/**
 * The takeoff's result. Areas, squares and lengths are not rounded; material quantities are in purchase
 * units, waste included, rounded up once for the job. Lengths in feet unless named `…In`.
 */
import type { Advisory } from "./advisory";
import type { MaterialLine } from "./materials";
import type { LumberNominal } from "./lumber";
import type { EdgeType } from "./roof/edge-types";
import type { EdgeTotals } from "./roof/edges";
import type { CutListEntry } from "./roof/panels";
import type { ChannelResult } from "./ventilation/channel";
import type { VentilationResult } from "./ventilation/index";
import type { ThermalResult } from "./thermal/index";
import type { EdgeDistanceTerm, PlaneWindZones, WindZone } from "./wind/zones";

export type { EdgeType, EdgeTotals, MaterialLine, Advisory, CutListEntry, WindZone };

/** An edge piece's type and lengths: what every takeoff answer carries for each edge. */
export interface EdgeQuantities {
  /** The input edge number (edge i runs from vertex i to vertex i + 1). */
  index: number;
  type: EdgeType;
  planLengthFt: number;
  trueLengthFt: number;
}

/** An edge piece with where it lies and how its type was reached (the full detail). */
export interface EdgeResult extends EdgeQuantities {
  /** Piece number when the edge is split where a neighbouring plane's edge begins or ends. */
  part: number;
  /** The type from the geometry, before any override. */
  computedType: EdgeType;
  overridden: boolean;
  shared: boolean;
  /** The neighbouring plane along this piece, if shared. */
  sharedWith: { planeId: string; edgeIndex: number } | null;
  from: [number, number];
  to: [number, number];
}

/** A plane's panels: how many, each one's length and the cut list. */
export interface PanelQuantities {
  count: number;
  /** One entry per panel, whole inches. */
  lengthsIn: number[];
  cutList: CutListEntry[];
  longestIn: number;
}

export interface PanelsResult extends PanelQuantities {
  system: "standing-seam" | "exposed-fastener";
  coverageWidthIn: number;
  offcutSqFt: number;
  totalLengthFt: number;
}

export interface PlaneLayersResult {
  underlaymentSqFt: number;
  iceBarrier: null | { widthIn: number; courses: number; eaveLf: number; membraneLf: number; note?: string };
  battens: null | { nominal: LumberNominal; rows: number; lf: number; fasteners: number; spacingIn: number };
  counterBattens: null | { nominal: LumberNominal; runs: number; lf: number; fasteners: number; spacingIn: number };
  meshSqFt: number;
  dimpledSqFt: number;
  foilSqFt: number;
  deckSqFt: number;
}

/**
 * A plane's quantities: its areas, squares, typed edges with their lengths and its panels. The takeoff
 * answer of the calculation API carries these per plane unless the full detail is asked for.
 */
export interface PlaneQuantities {
  id: string;
  name: string;
  stackId: string;
  pitch: number;
  slopeFactor: number;
  planAreaSqFt: number;
  slopedAreaSqFt: number;
  squares: number;
  edges: EdgeQuantities[];
  panels: PanelQuantities;
}

/** A plane's full detail: also its corners' heights, where each edge piece lies, its wind zones and layers. */
export interface PlaneResult extends PlaneQuantities {
  angleDeg: number;
  /** Each vertex with its height (ft). */
  vertices: { x: number; y: number; z: number }[];
  eaveEdge: number;
  edges: EdgeResult[];
  panels: PanelsResult;
  windZones: PlaneWindZones;
  layers: PlaneLayersResult;
}

export interface ZoneFasteners {
  clips: number;
  clipScrews: number;
  /** Exposed-fastener screws in the zone (unrounded rate × area). */
  panelScrews: number;
  /** Clip-line (or panel centre-line) length in the zone along the slope, ft. */
  lineFt: number;
  /** Panel area in the zone along the slope, ft² (exposed-fastener panels). */
  areaSqFt: number;
}

export interface FastenersResult {
  /** Pieces placed on the roof, without waste. */
  clips: number;
  clipScrews: number;
  panelScrews: number;
  trimFasteners: number;
  spacerFasteners: number;
  zones: Record<WindZone, ZoneFasteners>;
}

export interface WindResult {
  aFt: number;
  leastHorizontalDimensionFt: number;
  leastHorizontalDimensionEstimated: boolean;
  meanRoofHeightFt: number | null;
  governs: EdgeDistanceTerm;
  hipRoof: boolean;
  basicWindSpeedMph: number | null;
  exposure: "B" | "C" | "D" | null;
}

export interface StackResult {
  id: string;
  name: string | null;
  planeIds: string[];
  planAreaSqFt: number;
  slopedAreaSqFt: number;
  squares: number;
  channel: ChannelResult;
  thermal: ThermalResult;
  /** The assembly no longer matches a tested uplift assembly (spacer present). */
  upliftAssembly: "tested" | "not-tested-needs-review" | "not-required";
}

export interface TakeoffTotals {
  planAreaSqFt: number;
  slopedAreaSqFt: number;
  squares: number;
  panelCount: number;
  panelLengthFt: number;
  offcutSqFt: number;
  deckSheets: number;
}

/** The takeoff with each plane's full detail (`P` = PlaneResult) or only its quantities (PlaneQuantities). */
export interface TakeoffResult<P extends PlaneQuantities = PlaneResult> {
  planes: P[];
  edgeTotals: EdgeTotals;
  totals: TakeoffTotals;
  materials: MaterialLine[];
  fasteners: FastenersResult;
  wind: WindResult;
  ventilation: VentilationResult;
  /** The roof's thermal figures: those of the dominant assembly (largest sloped area). */
  thermal: ThermalResult & { stackId: string };
  stacks: StackResult[];
  advisories: Advisory[];
}

/** The takeoff with each plane's quantities only. */
export type TakeoffQuantities = TakeoffResult<PlaneQuantities>;

export type TakeoffOutcome<R = TakeoffResult> =
  | { ok: true; result: R }
  | { ok: false; reason: string; path: (string | number)[]; fields?: Record<string, string> };
