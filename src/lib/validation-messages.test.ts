import { describe, expect, it } from "vitest";
import { z } from "zod";
import { labelOf, namedMessage, notSavedMessage, plainError, relabel, relabelFields, type FieldLabels } from "./validation-messages";

const plan = z.object({
  name: z.string().trim().min(1),
  latitude: z.number().min(-90).max(90),
  email: z.email(),
  kind: z.enum(["flat", "tou"]),
  energy: z.object({ periods: z.array(z.object({ centsPerKwh: z.number().min(0.01) })).min(1) }),
  stallDays: z.object({ on_hold: z.number().int() }),
  zip: z.string().regex(/^\d{5}$/, "Enter a ZIP code like 27401"),
});
const bad = { name: " ", latitude: Number.NaN, email: "nope", kind: "wizard", energy: { periods: [{ centsPerKwh: 1 }, { centsPerKwh: 0 }] }, stallDays: { on_hold: 2.5 }, zip: "1" };
const messages = (labels?: FieldLabels) => {
  const r = plan.safeParse(bad, labels ? { error: plainError(labels) } : undefined);
  return Object.fromEntries(r.error!.issues.map((i) => [i.path.join("."), i.message]));
};
const LABELS: FieldLabels = { latitude: "Latitude (°N)", "energy.periods.#": "Period {n}", "energy.periods.#.centsPerKwh": "Price (¢/kWh)" };

describe("validation messages in words", () => {
  it("names the field from its path and says what is wrong, with no zod wording", () => {
    expect(messages()).toEqual({
      name: "Name is required",
      latitude: "Latitude is required",
      email: "Email must be an e-mail address, like name@example.com",
      kind: "Kind must be one of: flat, tou",
      "energy.periods.1.centsPerKwh": "Period 2 — cents per kWh must be at least 0.01",
      "stallDays.on_hold": "On hold must be a whole number",
      zip: "Enter a ZIP code like 27401",
    });
  });

  it("names the field by the form's labels, list entries by their number", () => {
    const m = messages(LABELS);
    expect(m.latitude).toBe("Latitude (°N) is required");
    expect(m["energy.periods.1.centsPerKwh"]).toBe("Period 2 — Price (¢/kWh) must be at least 0.01");
    expect(m.name).toBe("Name is required");
  });

  it("finds labels by pattern and falls back to words for what a form does not label", () => {
    expect(labelOf("energy.periods.0.centsPerKwh", LABELS)).toBe("Period 1 — Price (¢/kWh)");
    expect(labelOf("energy.periods.3.label", LABELS)).toBe("Period 4 — label");
    expect(labelOf(["bands", 2, "maxWatts"])).toBe("Band 3 — max watts");
    expect(labelOf("lineItems.0.amountCents")).toBe("Line item 1 — amount cents");
    expect(labelOf("memberIds.1")).toBe("Member ID 2");
  });

  it("renames a server's message with the form's labels and leaves a schema's own message alone", () => {
    expect(relabel("energy.periods.1.centsPerKwh", "Period 2 — cents per kWh must be at least 0", LABELS)).toBe("Period 2 — Price (¢/kWh) must be at least 0");
    expect(relabel("latitude", "Enter the latitude in degrees", LABELS)).toBe("Enter the latitude in degrees");
    expect(relabelFields({ latitude: ["Latitude is required"] }, LABELS)).toEqual({ latitude: ["Latitude (°N) is required"] });
  });

  it("names the field in a problem list or status line whatever the message says", () => {
    expect(namedMessage("latitude", "Enter the latitude in degrees", LABELS)).toBe("Latitude (°N): Enter the latitude in degrees");
    expect(namedMessage("latitude", "Latitude is required", LABELS)).toBe("Latitude (°N) is required");
    expect(namedMessage("_", "Give a role or a status to change")).toBe("Give a role or a status to change");
    expect(notSavedMessage([["latitude", "Latitude is required"]], LABELS)).toBe("Not saved: Latitude (°N) is required.");
    expect(notSavedMessage([["finance.years", "Whole years from 10 to 40"], ["name", "Name is required"]], { "finance.years": "Years the savings run" })).toBe(
      "Not saved: Years the savings run: Whole years from 10 to 40. 1 more field needs attention, marked on the form.",
    );
  });
});
