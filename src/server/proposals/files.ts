import "server-only";
import { notFound } from "@/server/errors";
import { storage } from "@/server/storage";
import type { ProposalRow } from "./rows";

// ── Files ───────────────────────────────────────────────────────────────────────────────────

export const pdfFileName = (p: { number: number; version: number }, signed: boolean) => `proposal-P-${p.number}-v${p.version}${signed ? "-signed" : ""}.pdf`;

/** The stored bytes of a proposal's unsigned or signed PDF (404 when there is none). */
export async function readProposalPdf(p: Pick<ProposalRow, "pdfStorageKey" | "signedStorageKey">, which: "unsigned" | "signed"): Promise<Uint8Array> {
  const key = which === "signed" ? p.signedStorageKey : p.pdfStorageKey;
  if (!key) throw notFound(which === "signed" ? "Signed document" : "Document");
  const bytes = await storage().get(key);
  if (!bytes) throw notFound(which === "signed" ? "Signed document" : "Document");
  return bytes;
}

export function pdfResponse(bytes: Uint8Array, fileName: string): Response {
  return new Response(Buffer.from(bytes), {
    status: 200,
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="${fileName}"`,
      "Content-Length": String(bytes.byteLength),
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
}
