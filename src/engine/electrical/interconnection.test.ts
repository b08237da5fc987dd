import { describe, expect, it } from "vitest";
import { checkInterconnection } from "./interconnection";
import { checkRapidShutdown, requiredLabels } from "./rapid-shutdown";

describe("busbar rule, 705.12(B)(3)(2) (2020) / 705.12(B)(2)(3)(b) (2017)", () => {
  it("example 1: 200 A busbar, 200 A main, 7.6 kW (32 A): 40 + 200 = 240 ≤ 240 passes the 120 % rule", () => {
    const r = checkInterconnection({ edition: "2020", inverterOutputA: 32, backfedBreakerA: 40, busbarA: 200, mainBreakerA: 200 });
    expect(r.status).toBe("pass");
    expect(r.method).toBe("load-side (120 % rule)");
    expect(r.allowanceA).toBe(240);
  });

  it("example 2: 200 A busbar, 200 A main, 11.5 kW (48 A): 60 + 200 = 260 > 240 fails; a 175 A main would fit", () => {
    const r = checkInterconnection({ edition: "2020", inverterOutputA: 48, backfedBreakerA: 60, busbarA: 200, mainBreakerA: 200 });
    expect(r.status).toBe("fail");
    expect(r.deratedMainA).toBe(175); // 60 + 175 = 235 ≤ 240; 200 is the next standard rating up
    expect(r.whenItFails.join(" ")).toMatch(/supply side.*705\.11/);
    expect(r.whenItFails.join(" ")).toMatch(/authority having jurisdiction/);
  });

  it("example 3: 225 A busbar, 200 A main: 40 + 200 = 240 ≤ 270", () => {
    expect(checkInterconnection({ edition: "2017", inverterOutputA: 32, backfedBreakerA: 40, busbarA: 225, mainBreakerA: 200 }).status).toBe("pass");
  });

  it("example 4: 200 A busbar, 150 A main: 40 + 150 = 190 ≤ 200 fits the busbar itself", () => {
    expect(checkInterconnection({ edition: "2023", inverterOutputA: 32, backfedBreakerA: 40, busbarA: 200, mainBreakerA: 150 }).method).toBe("load-side (100 % rule)");
  });

  it("example 5: 100 A panel, 24 A inverter: 30 + 100 = 130 > 120; a 90 A main would fit; 2017 names 705.12(A)", () => {
    const r = checkInterconnection({ edition: "2017", inverterOutputA: 24, backfedBreakerA: 30, busbarA: 100, mainBreakerA: 100 });
    expect(r.status).toBe("fail");
    expect(r.deratedMainA).toBe(90);
    expect(r.whenItFails.join(" ")).toMatch(/705\.12\(A\)/);
  });
});

describe("rapid shutdown, 690.12, and labels", () => {
  it("three worked examples", () => {
    expect(checkRapidShutdown("2020", "none", true).status).toBe("fail"); // string voltage on the roof
    expect(checkRapidShutdown("2020", "microinverter", true).status).toBe("pass");
    expect(checkRapidShutdown("2017", "rapid-shutdown-device", true).status).toBe("pass");
    expect(checkRapidShutdown("2017", "none", false).status).toBe("pass"); // ground mount away from buildings
  });

  it("labels: DC labels only with DC circuits; raceway section by edition; back-fed breaker only under the 120 % rule", () => {
    const string2020 = requiredLabels("2020", { kind: "string", rule120: true, maxDcVoltageV: 418.1 });
    expect(string2020.find((l) => l.id === "dc-raceway")?.section).toBe("690.31(D)(2)");
    expect(string2020.find((l) => l.id === "dc-source")?.wording).toMatch(/418\.1 V/);
    expect(string2020.some((l) => l.id === "backfed-breaker")).toBe(true);
    expect(requiredLabels("2017", { kind: "string", rule120: false, maxDcVoltageV: null }).find((l) => l.id === "dc-raceway")?.section).toBe("690.31(G)(3)");
    const micro = requiredLabels("2020", { kind: "micro", rule120: false, maxDcVoltageV: null });
    expect(micro.some((l) => l.id === "dc-source" || l.id === "backfed-breaker")).toBe(false);
    expect(micro.some((l) => l.id === "rapid-shutdown-sign")).toBe(true);
  });
});
