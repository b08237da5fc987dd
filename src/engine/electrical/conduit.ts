/**
 * Raceway trade size by fill (NEC Chapter 9): Table 1 allows 40 % of the raceway's area for more
 * than two conductors (53 % for one, 31 % for two); Table 5 gives the area of insulated
 * conductors (THHN/THWN-2 here); Table 4 the internal area of each trade size (EMT here).
 * All areas from memory, in square inches. Common practice: rooftop runs in EMT.
 */
import { sizeLabel, type ConductorSize } from "./nec-tables";

/** Chapter 9 Table 5, THHN/THWN-2 approximate area, in² (from memory). */
export const THWN2_AREA_IN2: Record<ConductorSize, number> = {
  "14": 0.0097, "12": 0.0133, "10": 0.0211, "8": 0.0366, "6": 0.0507, "4": 0.0824, "3": 0.0973, "2": 0.1158, "1": 0.1562, "1/0": 0.1855, "2/0": 0.2223, "3/0": 0.2679, "4/0": 0.3237,
};

/** Chapter 9 Table 4, EMT total internal area, in² (from memory). */
export const EMT_AREA_IN2: readonly { trade: string; areaIn2: number }[] = [
  { trade: "1/2", areaIn2: 0.304 },
  { trade: "3/4", areaIn2: 0.533 },
  { trade: "1", areaIn2: 0.864 },
  { trade: "1-1/4", areaIn2: 1.496 },
  { trade: "1-1/2", areaIn2: 2.036 },
  { trade: "2", areaIn2: 3.356 },
];

/** Chapter 9 Table 1: fill allowed by number of conductors. */
export const fillFraction = (conductors: number) => (conductors === 1 ? 0.53 : conductors === 2 ? 0.31 : 0.4);

export type ConduitResult = { trade: string | null; fillIn2: number; conductors: number; text: string };

/** The smallest EMT trade size for the conductors, or null past 2 in. */
export function emtSize(wires: readonly { size: ConductorSize; count: number }[]): ConduitResult {
  const conductors = wires.reduce((s, w) => s + w.count, 0);
  const fill = wires.reduce((s, w) => s + w.count * THWN2_AREA_IN2[w.size], 0);
  const found = EMT_AREA_IN2.find((t) => t.areaIn2 * fillFraction(conductors) >= fill - 1e-9);
  const list = wires.filter((w) => w.count > 0).map((w) => `${w.count} × ${sizeLabel(w.size)}`).join(" + ");
  return {
    trade: found?.trade ?? null,
    fillIn2: Math.round(fill * 10000) / 10000,
    conductors,
    text: found ? `${found.trade} in. EMT (${list} THWN-2; ${Math.round(fill * 10000) / 10000} in² ≤ 40 % of ${found.areaIn2} in²)` : `more than 2 in. EMT for ${list}: split the run`,
  };
}
