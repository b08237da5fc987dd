import { describe, expect, it } from "vitest";
import { parseTemperatureCoefficient, vocCoefficientPctPerC } from "./module-coefficients";

describe("Voc temperature coefficient in the data sheet's unit", () => {
  it("converts mV/°C and V/°C to %/°C against Voc at STC (hand-worked: −134 mV/°C ÷ 49.5 V = −0.2707 %/°C)", () => {
    expect(vocCoefficientPctPerC(-0.27, "%/°C", 49.5)).toBe(-0.27);
    expect(vocCoefficientPctPerC(-134, "mV/°C", 49.5)).toBeCloseTo(-0.27071, 5);
    expect(vocCoefficientPctPerC(-0.134, "V/°C", 49.5)).toBeCloseTo(-0.27071, 5);
  });

  it("reads the ways data sheets print it", () => {
    expect(parseTemperatureCoefficient("-0.27 %/°C")).toEqual({ value: -0.27, unit: "%/°C" });
    expect(parseTemperatureCoefficient("−0,26%/K")).toEqual({ value: -0.26, unit: "%/°C" });
    expect(parseTemperatureCoefficient("-134 mV/°C")).toEqual({ value: -134, unit: "mV/°C" });
    expect(parseTemperatureCoefficient("-0.134 V/K")).toEqual({ value: -0.134, unit: "V/°C" });
    expect(parseTemperatureCoefficient("-0.3")).toEqual({ value: -0.3, unit: "%/°C" });
    expect(parseTemperatureCoefficient("minus a bit")).toBeNull();
    expect(parseTemperatureCoefficient("-0.3 A/°C")).toBeNull();
  });
});
