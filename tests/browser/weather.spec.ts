import { expect, test } from "@playwright/test";
import { alertOf, apiSignIn, signIn, unique, withDb } from "./support";

const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** An invented typical year as the generic hourly CSV; `badLine` (1-based) gets a wind speed of "calm". */
function hourlyCsv(badLine?: number): Buffer {
  const lines = ["# Invented year for the weather journey", "month,day,hour,ghi,dni,dhi,temp_air,wind_speed"];
  for (let m = 1; m <= 12; m++)
    for (let d = 1; d <= MONTH_DAYS[m - 1]; d++)
      for (let h = 0; h < 24; h++) {
        const sun = h >= 7 && h < 17;
        const wind = badLine === lines.length + 1 ? "calm" : "3";
        lines.push([m, d, h, sun ? 450 : 0, sun ? 550 : 0, sun ? 90 : 0, 12, wind].join(","));
      }
  return Buffer.from(lines.join("\n") + "\n");
}

async function stationCount(name: string): Promise<number> {
  return withDb(async (conn) => {
    const [rows] = await conn.query("SELECT COUNT(*) AS n FROM weather_station WHERE name = ?", [name]);
    return Number((rows as { n: number }[])[0].n);
  });
}

test("an admin sees the demo stations, is told which line of a bad file is wrong, and nothing is stored", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/weather");
  await expect(page.getByRole("heading", { name: "Weather", exact: true })).toBeVisible();
  const greensboro = page.getByRole("row", { name: /Greensboro/ });
  await expect(greensboro).toContainText("kWh/m²");
  await expect(greensboro).toContainText("Abernathy household");

  const name = unique("Bad line station");
  await page.getByLabel("Weather file").setInputFiles({ name: "bad-line.csv", mimeType: "text/csv", buffer: hourlyCsv(1234) });
  await page.getByLabel("Format", { exact: true }).selectOption("csv");
  await page.getByLabel("Name", { exact: true }).fill(name);
  await page.getByLabel("Latitude (° N)").first().fill("36.07");
  await page.getByLabel("Longitude (° E, west negative)").first().fill("-79.79");
  await page.getByLabel("Elevation (m)").fill("250");
  await page.getByLabel("UTC offset (h, standard time)").fill("-5");
  await page.getByRole("button", { name: "Check and add station" }).click();

  await expect(page.getByTestId("file-issues")).toContainText("Line 1234: wind_speed is not a number");
  await expect(alertOf(page).filter({ hasText: "not stored" })).toHaveCount(1); // the status beside the button
  expect(await stationCount(name)).toBe(0);
});

test("an admin adds an hourly CSV station, sees it listed, then deletes it", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/weather");
  const name = unique("Journey station");
  await page.getByLabel("Weather file").setInputFiles({ name: "journey.csv", mimeType: "text/csv", buffer: hourlyCsv() });
  await page.getByLabel("Name", { exact: true }).fill(name);
  await page.getByRole("button", { name: "Check and add station" }).click();
  // The site is required beside an hourly CSV: the server names the fields.
  await expect(page.getByText("Required for an hourly CSV").first()).toBeVisible();

  await page.getByLabel("Latitude (° N)").first().fill("35.6");
  await page.getByLabel("Longitude (° E, west negative)").first().fill("-82.55");
  await page.getByLabel("Elevation (m)").fill("650");
  await page.getByLabel("UTC offset (h, standard time)").fill("-5");
  await page.getByRole("button", { name: "Check and add station" }).click();
  await expect(page.getByRole("status").filter({ hasText: `${name} added` })).toBeVisible();
  const row = page.getByRole("row", { name: new RegExp(name) });
  // 365 days × 10 h × 450 W/m² = 1,643 kWh/m².
  await expect(row).toContainText("1,643");
  await expect(row).toContainText("Invented year for the weather journey");

  await row.getByRole("button", { name: `Delete ${name}` }).click();
  await row.getByRole("button", { name: "Delete for good" }).click();
  await expect(page.getByRole("row", { name: new RegExp(name) })).toHaveCount(0);
  expect(await stationCount(name)).toBe(0);
});

test("a sales rep reads the stations but cannot add one (403)", async ({ page, request }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/weather");
  await expect(page.getByRole("row", { name: /Greensboro/ })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Add a station" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Delete/ })).toHaveCount(0);

  await apiSignIn(request, "rep@tallgrass.example");
  const name = unique("Rep station");
  const res = await request.post("/api/weather-stations", {
    multipart: {
      file: { name: "rep.csv", mimeType: "text/csv", buffer: hourlyCsv() },
      name,
      latitude: "36",
      longitude: "-80",
      elevationM: "200",
      utcOffsetHours: "-5",
    },
  });
  expect(res.status()).toBe(403);
  expect((await res.json()).error.code).toBe("forbidden");
  expect(await stationCount(name)).toBe(0);

  const nearest = await request.get("/api/weather-stations/nearest?lat=36.1012&lon=-79.7711");
  expect(nearest.status()).toBe(200);
  const body = await nearest.json();
  expect(body.data.found).toBe(true);
  expect(body.data.station.name).toContain("Greensboro");
  const far = await (await request.get("/api/weather-stations/nearest?lat=47.6&lon=-122.3")).json();
  expect(far.data).toMatchObject({ found: false, maxDistanceKm: 200 });
  expect(far.data.message).toContain("No weather station within 200 km");
});
