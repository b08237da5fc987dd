// A household that reads Spanish (issue #18 item 6), against a real MariaDB and the dev outbox:
// the proposal link, the signing code and the signed copy reach the homeowner in Spanish, the
// stored PDF and the signed copy are in Spanish, and the rep's own notice stays English.
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { household, deal } from "@/db/schema";
import type { MailFake } from "@/fakes/mail-server";
import { formatCents } from "@/lib/format";
import { haversineKm } from "@/engine/geo";
import { translator } from "@/lib/i18n/translator";
import { snapshotText } from "@/lib/snapshot-text";
import { env } from "@/env";
import { stampedHeaders } from "@/server/client-address";
import { LIMITS } from "@/server/limits";
import { client, latestToken, mailTo, newDeal, newWorld, signatureDataUrl, startMailIfNeeded, type World } from "./support";

let fake: MailFake | null = null;
let w: World;

type Mods = {
  proposals: typeof import("@/server/proposals");
  signing: typeof import("@/server/signing");
  db: typeof import("@/server/db");
};
let m: Mods;

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = { proposals: await import("@/server/proposals"), signing: await import("@/server/signing"), db: await import("@/server/db") };
  w = await newWorld("Proposal Spanish Solar");
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

async function pdfText(bytes: Uint8Array): Promise<string> {
  const { extractText, getDocumentProxy } = await import("unpdf");
  return (await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true })).text;
}

/** A deal whose household the rep marked Spanish, and its proposal sent. */
async function sentInSpanish() {
  const d = await newDeal(w);
  const [row] = await m.db.db().select({ householdId: deal.householdId }).from(deal).where(eq(deal.id, d.dealId));
  await m.db.db().update(household).set({ language: "es" }).where(eq(household.id, row.householdId));
  const s = await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
  const link = (await mailTo(d.email)).find((mail) => /propuesta solar/.test(mail.subject));
  const token = link?.html?.match(/\/p\/([A-Za-z0-9_-]{43})/)?.[1];
  if (!link || !token) throw new Error(`no Spanish proposal link e-mailed to ${d.email}`);
  const load = async () => (await m.proposals.findProposalByToken(token))!;
  return { ...d, id: s.id, label: s.label, token, link, load };
}

describe("a proposal for a household that reads Spanish", () => {
  it("e-mails the link in Spanish and stores a Spanish PDF with the English legal text kept", async () => {
    const x = await sentInSpanish();
    expect(x.link.subject).toBe(`Su propuesta solar de Proposal Spanish Solar (${x.label})`);
    expect(x.link.html).toContain('lang="es"');
    expect(x.link.html).toContain("Abrir su propuesta");
    expect(x.link.html).toContain("2 opciones para comparar");
    expect(x.link.html).not.toContain("Open your proposal");
    const p = await x.load();
    expect(p.locale).toBe("es");
    expect(p.snapshot.household.language).toBe("es");
    const text = await pdfText(await m.proposals.readProposalPdf(p, "unsigned"));
    expect(text).toContain("Propuesta solar");
    expect(text).toContain("Su derecho a cancelar");
    expect(text).toContain("Traducción; el texto en inglés prevalece.");
    expect(text).toContain("NOTICE OF CANCELLATION");
  });

  it("prints the snapshot's assumptions, notes and cautions in Spanish, with no English sentence left", async () => {
    const x = await sentInSpanish();
    const p = await x.load();
    const texts = p.snapshot.texts;
    if (!texts) throw new Error("a new snapshot stores its homeowner texts as catalog messages");
    // The page frame (header and "página n de m") can fall inside a sentence that runs onto the next page.
    const frame = new RegExp(`Proposal Spanish Solar Propuesta ${x.label} · ${p.snapshot.household.name} Proposal Spanish Solar página \\d+ de \\d+ `, "g");
    const flat = (await pdfText(await m.proposals.readProposalPdf(p, "unsigned"))).replace(/\s+/g, " ").replace(frame, "");
    const stored = [...texts.assumptions, ...texts.cautions, ...texts.notes];
    expect(stored.every((t) => typeof t !== "string")).toBe(true);
    for (const item of stored) {
      expect(flat).not.toContain(snapshotText(item, "en"));
      expect(flat).toContain(snapshotText(item, "es"));
    }
    expect(flat).toContain("Pérdidas del sistema:");
    expect(flat).toContain("Estimaciones, no una garantía");
    expect(flat).not.toContain("Estimates, not a guarantee");
    expect(flat).not.toContain("Deposits follow the installer's deposit policy");
    // The price lines: our words in Spanish, the company's own line names as typed.
    expect(flat).toContain("Precio del sistema 8,000 W × 300 ¢/W");
    expect(flat).toContain("un monto fijo");
    for (const english of ["System price", "fixed amount", "per job"]) expect(flat).not.toContain(english);
  });

  it("stores where the weather was measured and how far it is from the home (the page's station line)", async () => {
    const p = await (await sentInSpanish()).load();
    const station = p.snapshot.station;
    if (!station) throw new Error("a new snapshot names its weather station");
    expect(station.name.length).toBeGreaterThan(0);
    expect(station.distanceKm).toBe(Math.round(haversineKm(p.snapshot.household, station)));
    expect(translator("es", "page")("home.station", { place: station.name, km: station.distanceKm })).toBe(`Clima de la estación de ${station.name}, a ${station.distanceKm} km de distancia.`);
  });

  it("sends the code and the signed copy in Spanish; the rep's notice stays English", async () => {
    const x = await sentInSpanish();
    await m.signing.sendSigningCode(await x.load(), x.token, client);
    const codeMail = (await mailTo(x.email)).find((mail) => /código para firmar/.test(mail.subject));
    expect(codeMail?.html).toContain("Escriba este código");
    const code = codeMail!.subject.match(/(\d{6})/)![1];
    const { session } = await m.signing.verifySigningCode(await x.load(), { code }, client);
    await m.signing.signProposal(await x.load(), x.token, { position: 1, signerName: "Tess Testwell", consent: true, signaturePng: await signatureDataUrl() }, client, session);

    const copy = (await mailTo(x.email)).find((mail) => /contrato firmado/.test(mail.subject));
    expect(copy?.subject).toBe(`Su contrato firmado con Proposal Spanish Solar (${x.label})`);
    expect(copy?.html).toContain("Gracias, Tess Testwell.");
    expect(copy?.html).toContain("Puede cancelar este contrato sin ninguna penalidad");
    const signed = await x.load();
    const offer = signed.snapshot.offers.find((o) => o.position === 1)!;
    expect(copy?.html).toContain(formatCents(offer.figures.summary.contractCents, "es"));
    expect((await mailTo(w.rep.email)).some((mail) => mail.subject === `Signed: the Testwell household (${x.label})`)).toBe(true);

    const text = await pdfText(await m.proposals.readProposalPdf(signed, "signed"));
    expect(text).toContain("Certificado de firma");
    expect(text).toContain("Firmado electrónicamente por Tess Testwell");
    expect(text).toContain("Consent: before signing");
  });
});

describe("the homeowner's switch on the page (POST /api/public/proposals/<token>/language)", () => {
  const post = async (token: string, body: unknown) => {
    const { POST } = await import("@/app/api/public/proposals/[token]/language/route");
    const req = new NextRequest(`http://localhost/api/public/proposals/${token}/language`, {
      method: "POST",
      headers: { origin: env().APP_URL, "content-type": "application/json" },
      body: JSON.stringify(body),
    });
    return POST(req, { params: Promise.resolve({ token }) });
  };

  it("keeps the homeowner's choice for this proposal: later e-mails follow it, the PDF stays as sent", async () => {
    const d = await newDeal(w);
    await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
    const token = await latestToken(d.email);
    const load = async () => (await m.proposals.findProposalByToken(token))!;
    expect((await load()).locale).toBe("en");

    const res = await post(token, { locale: "es" });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ data: { locale: "es" } });
    expect((await load()).locale).toBe("es");
    await m.signing.sendSigningCode(await load(), token, client);
    expect((await mailTo(d.email)).some((mail) => /^Su código para firmar: \d{6}$/.test(mail.subject))).toBe(true);
    expect((await load()).snapshot.household.language).toBe("en");

    const bad = await post(token, { locale: "fr" });
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as { error: { fields: Record<string, string[]> } }).error.fields.locale).toEqual(["Choose English or Español"]);
    expect((await load()).locale).toBe("es");
    expect((await post("x".repeat(43), { locale: "en" })).status).toBe(404);
  });

  it(`takes ${LIMITS.languageLink.points} switches of one proposal in ${LIMITS.languageLink.minutes} minutes, then 429 with the wait in the page's language`, async () => {
    const d = await newDeal(w);
    await m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
    const token = await latestToken(d.email);
    const { POST } = await import("@/app/api/public/proposals/[token]/language/route");
    const address = `192.0.2.${10 + Math.floor(Math.random() * 200)}`; // RFC 5737 documentation range
    const flip = (locale: "en" | "es") => {
      const headers = stampedHeaders(address);
      headers.set("origin", env().APP_URL);
      headers.set("content-type", "application/json");
      const req = new NextRequest(`http://localhost/api/public/proposals/${token}/language`, { method: "POST", headers, body: JSON.stringify({ locale }) });
      return POST(req, { params: Promise.resolve({ token }) });
    };
    for (let i = 0; i < LIMITS.languageLink.points; i++) expect((await flip(i % 2 === 0 ? "es" : "en")).status, `switch ${i + 1}`).toBe(200);
    const refused = await flip("es");
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(9 * 60);
    // The last switch that went through was to English: the refusal speaks English.
    expect(((await refused.json()) as { error: { code: string; message: string } }).error).toEqual({
      code: "too_many_language_link",
      message: "You changed the language many times just now. Try again in 10 minutes.",
    });
    expect((await m.proposals.findProposalByToken(token))?.locale).toBe("en");
  });
});
