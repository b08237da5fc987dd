import { expect, test } from "@playwright/test";

// A rep or a crew adds Kilowright to a tablet's or phone's home screen: the page names its icons
// and manifest, and each is served (no 404 for /favicon.ico on any page).
test("every page names a favicon, a home-screen icon and a manifest, and each is served", async ({ page, request }) => {
  await page.goto("/sign-in");
  const hrefs = await page.evaluate(() =>
    Array.from(document.querySelectorAll<HTMLLinkElement>('link[rel="icon"], link[rel="apple-touch-icon"], link[rel="manifest"]')).map((l) => `${l.rel} ${l.getAttribute("href")}`),
  );
  expect(hrefs).toEqual(expect.arrayContaining(["icon /favicon.ico", "icon /icon.svg", "apple-touch-icon /apple-touch-icon.png", "manifest /manifest.webmanifest"]));

  const favicon = await request.get("/favicon.ico");
  expect(favicon.status()).toBe(200);
  const bytes = await favicon.body();
  expect([...bytes.subarray(0, 4)]).toEqual([0, 0, 1, 0]); // an ICO header: reserved 0, type 1 (icon)

  const manifest = await request.get("/manifest.webmanifest");
  expect(manifest.status()).toBe(200);
  const m = (await manifest.json()) as { name: string; start_url: string; display: string; icons: { src: string; sizes: string; type: string }[] };
  expect(m).toMatchObject({ name: "Kilowright", start_url: "/", display: "standalone" });
  // Installable on Android needs a 192 and a 512 px icon (web.dev's installability criteria, common practice).
  expect(m.icons.map((i) => i.sizes)).toEqual(expect.arrayContaining(["192x192", "512x512"]));
  for (const icon of [...m.icons.map((i) => i.src), "/apple-touch-icon.png"]) {
    const res = await request.get(icon);
    expect(res.status(), icon).toBe(200);
    expect(res.headers()["content-type"], icon).toMatch(/^image\//);
  }
});
