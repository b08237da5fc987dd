/**
 * The point of interconnection on the load side of the service disconnect, and what the code asks
 * of the busbar (NEC 705.12(B)(3) in 2020/2023; 705.12(B)(2)(3) in 2017; see SECTIONS):
 * - (1) "100 % rule": 125 % of the inverters' output current + the main breaker ≤ the busbar rating;
 * - (2) "120 % rule": the same sum ≤ 120 % of the busbar rating, with the back-fed breaker at the
 *   opposite end of the busbar from the main breaker and a warning label beside it.
 * When both fail, what usually follows: a smaller main breaker (only when the load calculation of
 * Article 220 allows it), a supply-side connection (705.11 in 2020/2023, 705.12(A) in 2017), or a
 * new panel. The authority having jurisdiction (AHJ) and the utility decide.
 */
import { CONTINUOUS_FACTOR, type CheckStatus, type ElectricalCheck } from "./circuit";
import { SECTIONS, STANDARD_OCPD_A, type NecEdition } from "./nec-tables";

/** Busbar allowance of the 120 % rule. */
export const BUSBAR_ALLOWANCE = 1.2;

/** inverterOutputA: the inverters' continuous output currents reaching the panel, summed; backfedBreakerA: from the circuit sizing; all in A. */
export type InterconnectionInput = { edition: NecEdition; inverterOutputA: number; backfedBreakerA: number; busbarA: number; mainBreakerA: number };

export type InterconnectionResult = {
  status: CheckStatus;
  method: "load-side (100 % rule)" | "load-side (120 % rule)" | "none fits on the load side";
  /** 125 % of the inverter output current, A. */
  inverterShareA: number;
  busbarA: number;
  mainBreakerA: number;
  /** 120 % of the busbar, A. */
  allowanceA: number;
  backfedBreakerA: number;
  /** The largest standard main breaker that would let the 120 % rule pass (null: none ≥ 60 A). */
  deratedMainA: number | null;
  checks: ElectricalCheck[];
  whenItFails: string[];
};

const r2 = (x: number) => Math.round(x * 100) / 100;

export function checkInterconnection(x: InterconnectionInput): InterconnectionResult {
  const section = SECTIONS[x.edition].busbar;
  const share = r2(x.inverterOutputA * CONTINUOUS_FACTOR);
  const sum = share + x.mainBreakerA;
  const allowance = x.busbarA * BUSBAR_ALLOWANCE;
  const fullRule = sum <= x.busbarA + 1e-9;
  const rule120 = sum <= allowance + 1e-9;
  const deratedMain = [...STANDARD_OCPD_A].reverse().find((r) => r >= 60 && r < x.mainBreakerA && share + r <= allowance + 1e-9) ?? null;
  const status: CheckStatus = fullRule || rule120 ? "pass" : "fail";
  const checks: ElectricalCheck[] = [
    {
      id: "busbar-120",
      status,
      rule: `${section}: 125 % of the inverter output current + the main breaker ≤ 120 % of the busbar (section numbers from memory)`,
      detail: `${r2(x.inverterOutputA)} A × 1.25 = ${r2(share)} A + ${x.mainBreakerA} A main = ${r2(sum)} A ${rule120 ? "≤" : ">"} ${x.busbarA} A × 1.2 = ${r2(allowance)} A${rule120 && !fullRule ? "; the back-fed breaker goes at the opposite end of the busbar from the main" : ""}`,
    },
  ];
  const whenItFails = status === "pass"
    ? []
    : [
        deratedMain
          ? `Derate the main breaker to ${deratedMain} A (then ${r2(share)} A + ${deratedMain} A ≤ ${r2(allowance)} A) — only if the dwelling's load calculation (Article 220) allows it.`
          : "A smaller main breaker does not make it fit.",
        `Connect on the supply side of the service disconnect (${x.edition === "2017" ? "705.12(A)" : "705.11"}), with the utility's consent.`,
        "Replace the panel with one whose busbar rating allows the back-fed breaker.",
        "The authority having jurisdiction and the utility decide which is accepted.",
      ];
  return {
    status,
    method: fullRule ? "load-side (100 % rule)" : rule120 ? "load-side (120 % rule)" : "none fits on the load side",
    inverterShareA: r2(share),
    busbarA: x.busbarA,
    mainBreakerA: x.mainBreakerA,
    allowanceA: r2(allowance),
    backfedBreakerA: x.backfedBreakerA,
    deratedMainA: status === "pass" ? null : deratedMain,
    checks,
    whenItFails,
  };
}
