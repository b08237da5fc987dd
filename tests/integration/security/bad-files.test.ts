// Bad files are refused or made harmless: images are decoded within a pixel limit and
// re-encoded (a 16000 × 16000 PNG is refused from its header, quickly), a file that claims to
// be an image but does not decode is refused, and Green Button XML with invalid characters or
// 60,000 nested elements is a 422 with the reason. Nothing is stored for a refused file.
import { and, eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household, upload } from "@/db/schema";
import { db } from "@/server/db";
import { acceptDealUpload } from "@/server/energy";
import { MAX_IMAGE_PIXELS } from "@/server/photos";
import type { Member } from "@/server/session";
import { addSitePhoto } from "@/server/site-photos";
import { MAX_SIGNATURE_PIXELS, signaturePngBytes } from "@/server/signing";
import { newCompany, rejects } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";
import { openDeal } from "@/server/deal-scope";

let owner: Member;
let dealId: string;
/** 16000 × 16000 white pixels: 768 MB decoded, under 1 MB as PNG (generated once). */
let bombPng: Uint8Array;

const uploadRows = async () => (await db().select({ id: upload.id }).from(upload).where(and(eq(upload.companyId, owner.companyId), eq(upload.dealId, dealId)))).length;
const fakePng = () => {
  // A PNG signature and IHDR chunk type, then noise: "claims to be an image".
  const bytes = new Uint8Array(4096).map((_, i) => (i * 7919) % 251);
  bytes.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52], 0);
  return bytes;
};

beforeAll(async () => {
  owner = await newCompany("Bad File Solar");
  const householdId = crypto.randomUUID();
  dealId = crypto.randomUUID();
  await db().insert(household).values({ id: householdId, companyId: owner.companyId, name: "Filed household", street: "5 Byte Lane", city: "Testville", region: "NC", postalCode: "27000", latitude: 36, longitude: -79.8 });
  await db().insert(deal).values({ id: dealId, companyId: owner.companyId, householdId, ownerUserId: owner.userId, stage: "lead", source: "Referral" });
  bombPng = new Uint8Array(await sharp({ create: { width: 16_000, height: 16_000, channels: 3, background: "#ffffff" }, limitInputPixels: false }).png().toBuffer());
}, 120_000);

describe("images", () => {
  it(`refuses a 16000 × 16000 PNG as a site photo from its header (over ${MAX_IMAGE_PIXELS / 1e6} MP), quickly, storing nothing`, async () => {
    const rows = await uploadRows();
    const started = performance.now();
    const err = await rejects(addSitePhoto(owner, dealId, { name: "roof.png", bytes: bombPng }), 422, "image_too_large");
    expect(performance.now() - started).toBeLessThan(2_000);
    expect(err.message).toBe("The photo is 16000 × 16000 px (256 megapixels); images up to 40 megapixels are accepted.");
    expect(await uploadRows()).toBe(rows);
  });

  it("refuses the same PNG as a bill photo, and a file that claims to be a PNG but does not decode", async () => {
    const rows = await uploadRows();
    const started = performance.now();
    expect((await rejects(acceptDealUpload(await openDeal(owner, dealId), { name: "bill.png", bytes: bombPng }), 422, "image_too_large")).message).toMatch(/16000 × 16000 px/);
    expect(performance.now() - started).toBeLessThan(2_000);
    expect((await rejects(acceptDealUpload(await openDeal(owner, dealId), { name: "bill.png", bytes: fakePng() }), 422, "unreadable_image")).message).toMatch(/could not be read/);
    expect(await uploadRows()).toBe(rows);
  });

  it("keeps a bill photo re-encoded: its pixels, without the sender's metadata", async () => {
    const photo = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 200, g: 200, b: 190 } } })
      .withExif({ IFD0: { Copyright: "someone's phone", Artist: "GPS here" } })
      .jpeg()
      .toBuffer();
    const outcome = await acceptDealUpload(await openDeal(owner, dealId), { name: "bill.jpg", bytes: new Uint8Array(photo) });
    expect(outcome.kind).toBe("bill-image");
    const [row] = await db().select({ storageKey: upload.storageKey, mimeType: upload.mimeType }).from(upload).where(eq(upload.id, outcome.upload.id));
    expect(row.mimeType).toBe("image/jpeg");
    const { storage } = await import("@/server/storage");
    const kept = await storage().get(row.storageKey);
    const meta = await sharp(Buffer.from(kept!)).metadata();
    expect([meta.format, meta.width, meta.height, meta.exif]).toEqual(["jpeg", 800, 600, undefined]);
  });

  it(`refuses a drawn signature over ${MAX_SIGNATURE_PIXELS / 1e6} MP or that does not decode, and re-encodes a good one`, async () => {
    const big = await sharp({ create: { width: 3000, height: 3000, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).png().toBuffer();
    expect(big.byteLength).toBeLessThan(200 * 1024); // within the byte limit: only the pixel limit refuses it
    expect((await rejects(signaturePngBytes(`data:image/png;base64,${big.toString("base64")}`), 422, "image_too_large")).fields).toHaveProperty("signaturePng");
    expect((await rejects(signaturePngBytes(`data:image/png;base64,${Buffer.from(fakePng()).toString("base64")}`), 422)).fields).toHaveProperty("signaturePng");
    const good = await sharp({ create: { width: 600, height: 200, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).withExif({ IFD0: { Artist: "x" } }).png().toBuffer();
    const out = await signaturePngBytes(`data:image/png;base64,${good.toString("base64")}`);
    const meta = await sharp(Buffer.from(out)).metadata();
    expect([meta.format, meta.width, meta.height, meta.exif]).toEqual(["png", 600, 200, undefined]);
  });
});

describe("Green Button XML", () => {
  it("answers 422 with the reason for an invalid character, storing nothing", async () => {
    const rows = await uploadRows();
    const xml = '<?xml version="1.0"?>\n<feed xmlns="http://www.w3.org/2005/Atom">\n<entry>\u0001</entry>\n</feed>';
    const err = await rejects(acceptDealUpload(await openDeal(owner, dealId), { name: "usage.xml", bytes: new TextEncoder().encode(xml) }), 422, "invalid_input");
    expect(err.message).toMatch(/Green Button XML: invalid character U\+0001/);
    expect(err.fields).toEqual({ "line 3": [expect.stringMatching(/invalid character U\+0001/)] });
    expect(await uploadRows()).toBe(rows);
  });

  it("answers 422 for 60,000 nested elements, quickly, never a 500", async () => {
    const rows = await uploadRows();
    const xml = "<feed>" + "<entry>".repeat(60_000) + "</entry>".repeat(60_000) + "</feed>";
    const started = performance.now();
    const err = await rejects(acceptDealUpload(await openDeal(owner, dealId), { name: "deep.xml", bytes: new TextEncoder().encode(xml) }), 422, "invalid_input");
    expect(performance.now() - started).toBeLessThan(5_000);
    expect(err.message).toMatch(/nest deeper than 64 levels/);
    expect(await uploadRows()).toBe(rows);
  });
});

describe("serving stored files", () => {
  it("a stored photo goes out with its exact type, nosniff and a sandbox; the upload route gives metadata, never the bytes", async () => {
    const headers = await signedInHeaders(owner);
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: "#336699" } }).png().toBuffer();
    const photo = await addSitePhoto(owner, dealId, { name: "panel.png", bytes: new Uint8Array(png) });
    const { GET } = await import("@/app/api/deals/[id]/site-photos/[uploadId]/route");
    const res = await GET(new NextRequest(`http://localhost/api/deals/${dealId}/site-photos/${photo.id}`, { headers }), { params: Promise.resolve({ id: dealId, uploadId: photo.id }) });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("image/jpeg");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("content-security-policy")).toContain("sandbox");
    expect(res.headers.get("content-disposition")).toMatch(/^inline; filename="site-photo-/);

    const { GET: getUpload } = await import("@/app/api/uploads/[id]/route");
    const meta = await getUpload(new NextRequest(`http://localhost/api/uploads/${photo.id}`, { headers }), { params: Promise.resolve({ id: photo.id }) });
    expect(meta.headers.get("content-type")).toMatch(/^application\/json/);
  });
});
