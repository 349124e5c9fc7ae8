/**
 * Dew point by the Magnus formula with Alduchov & Eskridge (1996) coefficients
 * a = 17.625, b = 243.04 °C (good to about 0.35 °C from −40 to 50 °C):
 *   γ = ln(RH/100) + a·T/(b + T),  Td = b·γ/(a − γ)
 */
export const MAGNUS_A = 17.625;
export const MAGNUS_B_C = 243.04;

export const fToC = (f: number) => (f - 32) / 1.8;
export const cToF = (c: number) => c * 1.8 + 32;

export function dewPointC(tempC: number, rhPct: number): number {
  if (!Number.isFinite(tempC) || !Number.isFinite(rhPct) || rhPct <= 0 || rhPct > 100) {
    throw new RangeError("dew point needs a finite temperature and a relative humidity in (0, 100] %");
  }
  const g = Math.log(rhPct / 100) + (MAGNUS_A * tempC) / (MAGNUS_B_C + tempC);
  return (MAGNUS_B_C * g) / (MAGNUS_A - g);
}

export function dewPointF(tempF: number, rhPct: number): number {
  return cToF(dewPointC(fToC(tempF), rhPct));
}
