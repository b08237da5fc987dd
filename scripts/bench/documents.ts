/**
 * Benchmarks for the documents: the proposal PDF with 3 offers (17 pages: charts as vectors,
 * subset fonts) and stamping a signature plus the signing certificate into it. Run through
 * scripts/bench.ts (`npx tsx scripts/bench.ts --only=documents` runs these alone and leaves
 * docs/benchmarks.md as it is).
 */
import { createHash } from "node:crypto";
import type { BenchCase } from "./types";
import { renderProposalPdf } from "../../src/documents/proposal-pdf";
import { stampSignedPdf, type SignatureStamp } from "../../src/documents/signed-pdf";
import { FIXTURE_META, fixtureSignaturePng, fixtureSnapshot, fixtureStamp } from "../../src/documents/fixtures";

const snapshot = fixtureSnapshot(3);
let unsigned: Uint8Array | null = null;
let stamp: SignatureStamp | null = null;

export const cases: BenchCase[] = [
  {
    name: "documents: proposal PDF, 3 offers",
    goal: "≤ 300 ms median",
    goalMedianMs: 300,
    run: () => renderProposalPdf(snapshot, FIXTURE_META),
  },
  {
    name: "documents: stamp signature + certificate",
    goal: "≤ 150 ms median",
    goalMedianMs: 150,
    setup: async () => {
      unsigned = await renderProposalPdf(snapshot, FIXTURE_META);
      const sha = createHash("sha256").update(unsigned).digest("hex");
      stamp = { ...fixtureStamp(await fixtureSignaturePng(), sha), cancelDeadlineText: "Friday, March 6, 2026" };
    },
    run: () => stampSignedPdf(unsigned as Uint8Array, stamp as SignatureStamp),
  },
];
