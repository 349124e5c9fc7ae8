/**
 * An advisory is a finding about the roof: a code minimum missed, a detail that will not work,
 * or a caution. Codes are our own, stable strings (kebab-case) that the client and tests key on.
 */
export const SEVERITIES = ["error", "warning", "info"] as const;
export type Severity = (typeof SEVERITIES)[number];

export interface Advisory {
  /** Our own stable code, e.g. "slope-below-code-minimum". */
  code: string;
  severity: Severity;
  /** Plain-language message a contractor understands. */
  message: string;
  /** The published reference (code section, standard, table) or "common practice". */
  reference: string;
  /** Planes concerned; empty for roof-wide findings. */
  planeIds: string[];
}

export const advisory = (
  code: string,
  severity: Severity,
  message: string,
  reference: string,
  planeIds: string[] = [],
): Advisory => ({ code, severity, message, reference, planeIds });
