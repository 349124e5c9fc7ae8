/**
 * The takeoff input's limits and lists, apart from its schemas so that both the schemas (./takeoff) and the fast
 * parse of the usual input (./takeoff-fast) can use them.
 */
import { LUMBER_NOMINALS } from "../engine/lumber";
import { EDGE_TYPES } from "../engine/roof/edge-types";

export { EDGE_TYPES };
export const MAX_PLANES = 500;
/** Roof assemblies per roof: far more than any roof has, small enough to keep a body and a PDF bounded. */
export const MAX_STACKS = 50;
/**
 * Plan coordinates within ±MAX_PLAN_FT of the origin. The engine lays out every panel and batten course, so
 * a plane thousands of feet across (or a panel or batten spacing of a fraction of an inch) would make
 * millions of them: these bounds, far beyond any house, keep one request from exhausting the server.
 */
export const MAX_PLAN_FT = 1_000;
/** Narrowest panel coverage and closest batten spacing accepted, inches. */
export const MIN_PANEL_COVERAGE_IN = 6;
export const MIN_BATTEN_SPACING_IN = 6;
/** Longest plane, assembly or penetration id. */
export const MAX_ID_LENGTH = 100;
export const ATTIC_TYPES = ["vented", "unvented", "cathedral"] as const;
export const CODE_EDITIONS = [2012, 2015, 2018, 2021, 2024] as const;
export const UNDERLAYMENT_KINDS = ["self-adhered", "synthetic", "felt"] as const;
export const SPACER_KINDS = ["none", "battens", "mesh", "dimpled"] as const;
/** Batten and counter-batten sizes (one list: the engine's lumber table). */
export { LUMBER_NOMINALS };
export const PANEL_SYSTEMS = ["standing-seam", "exposed-fastener"] as const;
export const PANEL_STARTS = ["left", "right", "centred"] as const;
export const PENETRATION_KINDS = ["pipe", "chimney", "skylight", "vent", "other"] as const;
export const CLIMATE_ZONE_RE = /^[1-8][ABC]?$/;
/** Wind exposure categories B, C, D (ASCE 7 26.7.3). */
export const WIND_EXPOSURES = ["B", "C", "D"] as const;
