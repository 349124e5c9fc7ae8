/**
 * Roll goods: underlayment, mats, foil. Net coverage of one roll = (width − side lap) × (length − end lap);
 * rolls = ceil(area × (1 + waste) / net coverage), rounded once for the whole job (common practice).
 */
import { ceilTol, fmt, num, roundedUp, wasteText } from "../format";

export interface RollSpec {
  rollWidthIn: number;
  rollLengthFt: number;
  sideLapIn: number;
  endLapIn: number;
}

/** Net ft² one roll covers after laps. */
export const rollNetSqFt = (r: RollSpec): number => (Math.max(0, r.rollWidthIn - r.sideLapIn) / 12) * Math.max(0, r.rollLengthFt - r.endLapIn / 12);

export interface RollCount {
  exact: number;
  rolls: number;
  netSqFtPerRoll: number;
  basis: string;
}

/**
 * Rolls for an area. `layers` multiplies the area (two layers of felt), `what` names the area in the basis.
 * Example basis: "412.6 ft² sloped × 1.10 waste ÷ 914.8 ft² net per roll ((48 in - 4 in lap) × (250 ft - 6 in lap)) = 0.50, rounded up to 1 roll".
 */
export function rollsFor(areaSqFt: number, wastePct: number, r: RollSpec, opts: { layers?: number; what?: string } = {}): RollCount {
  const layers = opts.layers ?? 1;
  const net = rollNetSqFt(r);
  const exact = net > 0 ? (areaSqFt * layers * (1 + wastePct / 100)) / net : 0;
  const rolls = ceilTol(exact);
  const laps =
    r.sideLapIn || r.endLapIn
      ? `((${num(r.rollWidthIn)} in - ${num(r.sideLapIn)} in lap) × (${num(r.rollLengthFt)} ft - ${num(r.endLapIn)} in lap))`
      : `(${num(r.rollWidthIn)} in × ${num(r.rollLengthFt)} ft, butted)`;
  const basis =
    `${fmt(areaSqFt)} ft² ${opts.what ?? "sloped"}${layers > 1 ? ` × ${layers} layers` : ""} × ${wasteText(wastePct)} waste ÷ ` +
    `${fmt(net)} ft² net per roll ${laps} = ${roundedUp(exact, rolls, "roll")}`;
  return { exact, rolls, netSqFtPerRoll: net, basis };
}
