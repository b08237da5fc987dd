/**
 * Module temperature coefficients as data sheets print them. Voc's coefficient comes as a
 * relative figure (%/°C, e.g. −0.27 %/°C) or an absolute one (mV/°C, e.g. −134 mV/°C, or
 * V/°C, −0.134 V/°C); a kelvin and a degree Celsius are the same step, so /K reads as /°C.
 * The engine works in %/°C: relative = absolute / Voc(STC) × 100.
 */
export type CoefficientUnit = "%/°C" | "mV/°C" | "V/°C";
export const COEFFICIENT_UNITS: readonly CoefficientUnit[] = ["%/°C", "mV/°C", "V/°C"];

/** A Voc coefficient in %/°C from a value in any of the data-sheet units. */
export function vocCoefficientPctPerC(value: number, unit: CoefficientUnit, vocV: number): number {
  if (unit === "%/°C") return value;
  const voltsPerC = unit === "mV/°C" ? value / 1000 : value;
  return (voltsPerC / vocV) * 100;
}

/**
 * Reads "-0.27 %/°C", "−0.27%/K", "-134 mV/°C", "-0.134 V/K" (a bare number is %/°C). Null when
 * the text is not a coefficient.
 */
export function parseTemperatureCoefficient(text: string): { value: number; unit: CoefficientUnit } | null {
  const m = /^\s*([+\-−]?\d+(?:[.,]\d+)?)\s*(%|mv|v)?\s*(?:\/\s*(?:°\s*c|º\s*c|c|k|deg\s*c))?\s*$/i.exec(text);
  if (!m) return null;
  const value = Number(m[1].replace("−", "-").replace(",", "."));
  if (!Number.isFinite(value)) return null;
  const unit = (m[2] ?? "%").toLowerCase();
  return { value, unit: unit === "mv" ? "mV/°C" : unit === "v" ? "V/°C" : "%/°C" };
}
