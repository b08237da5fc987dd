import { describe, expect, it } from "vitest";
import { sitePositionProblem } from "./site-position";
import { zipMismatch, zipPlace } from "./zip-codes";

describe("zipPlace", () => {
  it("finds a ZIP's place and position offline, with or without the +4 part", () => {
    expect(zipPlace("27401")).toEqual({ zip: "27401", city: "Greensboro", region: "NC", latitude: 36.0697, longitude: -79.7682 });
    expect(zipPlace(" 27401-1234 ")?.city).toBe("Greensboro");
    expect(zipPlace("00601")).toMatchObject({ region: "PR", latitude: 18.16, longitude: -66.72 });
  });

  it("answers null for malformed, unlisted and position-less codes, never 0, 0", () => {
    expect(zipPlace("2740")).toBeNull();
    expect(zipPlace("K1A 0B1")).toBeNull();
    expect(zipPlace("00000")).toBeNull();
    // Military post codes are listed at 0, 0 in the data: no position rather than that one.
    expect(zipPlace("34001")).toBeNull();
  });
});

describe("sitePositionProblem", () => {
  it("accepts a house and refuses what a blank field or a slip becomes", () => {
    expect(sitePositionProblem(36.07, -79.77)).toBeNull();
    expect(sitePositionProblem(0, 0)).toMatch(/0, 0 is open sea/);
    expect(sitePositionProblem(0.004, -0.003)).toMatch(/0, 0/);
    expect(sitePositionProblem(Number.NaN, -79)).toMatch(/both latitude and longitude/);
    expect(sitePositionProblem(91, -79)).toMatch(/Latitude 91/);
    expect(sitePositionProblem(36, -181)).toMatch(/Longitude -181/);
  });
});

describe("zipMismatch", () => {
  it("is null near the ZIP and names the distance for a dropped sign or swapped numbers", () => {
    expect(zipMismatch("27401", 36.1, -79.8)).toBeNull();
    expect(zipMismatch("27401", 36.07, 79.77)?.distanceKm).toBeGreaterThan(10_000);
    expect(zipMismatch("27401", -79.77, 36.07)).toMatchObject({ city: "Greensboro" });
    expect(zipMismatch("99999", 36.07, 79.77)).toBeNull();
  });
});
