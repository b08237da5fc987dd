// The proposal PDF, the signed copy and its certificate in Spanish (issue #18 item 6): the
// document speaks the household's language, money and dates in es-US, and its legal texts say
// they are a translation and keep the English text.
import { extractText } from "unpdf";
import { beforeAll, describe, expect, it } from "vitest";
import { formatCents } from "@/lib/format";
import { FIXTURE_META, fixtureSignaturePng, fixtureSnapshot, fixtureStamp } from "./fixtures";
import { renderProposalPdf } from "./proposal-pdf";
import { stampSignedPdf } from "./signed-pdf";

async function pagesText(bytes: Uint8Array): Promise<string[]> {
  const { text } = await extractText(bytes.slice(), { mergePages: false });
  return text;
}

describe("the proposal PDF in Spanish", () => {
  const snapshot = fixtureSnapshot(2);
  let pages: string[];
  let all: string;
  let signedPages: string[];
  let certificate: string;

  beforeAll(async () => {
    const unsigned = await renderProposalPdf(snapshot, { ...FIXTURE_META, locale: "es" });
    pages = await pagesText(unsigned);
    all = pages.join("\n");
    const png = await fixtureSignaturePng();
    const signed = await stampSignedPdf(unsigned, { ...fixtureStamp(png, "0".repeat(64)), locale: "es", cancelDeadlineText: "viernes, 6 de marzo de 2026" });
    signedPages = await pagesText(signed);
    certificate = signedPages.slice(pages.length).join("\n");
  });

  it("speaks Spanish on every page, the frame included", () => {
    expect(pages[0]).toContain("Propuesta solar");
    expect(pages[0]).toContain(`para ${snapshot.household.name}`);
    expect(all).toContain("Su energía hoy");
    expect(all).toContain("Supuestos y avisos");
    expect(all).toContain("Su contrato");
    expect(all).toContain("Enero");
    pages.forEach((text, i) => expect(text).toContain(`página ${i + 1} de ${pages.length}`));
    for (const english of ["Your energy today", "Assumptions and disclosures", "Your agreement", "Solar proposal", "January"]) expect(all).not.toContain(english);
  });

  it("says what payback and ROI mean in Spanish", () => {
    expect(all.replace(/\s+/g, " ")).toContain("La recuperación de la inversión es el año en que el total acumulado");
    expect(all).toContain("Retorno simple (ROI) =");
    expect(all).not.toContain("Payback is the year");
  });

  it("prints money as es-US writes it", () => {
    for (const o of snapshot.offers) expect(all).toContain(formatCents(o.figures.summary.contractCents, "es"));
  });

  it("gives the right to cancel in Spanish, says it is a translation, and keeps the English text", () => {
    expect(all).toContain("Su derecho a cancelar");
    expect(all).toContain("AVISO DE CANCELACIÓN");
    expect(all).toContain("Traducción; el texto en inglés prevalece.");
    expect(all).toContain("Your right to cancel");
    expect(all).toContain("NOTICE OF CANCELLATION");
    expect(all).toContain("You, the buyer, may cancel this transaction");
  });

  it("stamps the signature page and appends the certificate in Spanish, with the English text of the law", () => {
    const signaturePage = signedPages.find((p) => p.includes("Su contrato") && p.includes("Firma del comprador"));
    expect(signaturePage).toContain("Firmado electrónicamente por");
    expect(certificate).toContain("Certificado de firma");
    const certificatePages = signedPages.length - pages.length;
    expect(certificate).toContain(`certificado de firma, página 1 de ${certificatePages}`);
    expect(certificate).toContain("Consentimiento:");
    expect(certificate).toContain("Traducción; el texto en inglés prevalece.");
    expect(certificate).toContain("Consent: before signing");
  });
});
