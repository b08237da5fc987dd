import type { Metadata } from "next";
import { Wordmark } from "@/components/wordmark";
import { VerifyClient } from "./verify-client";

export const metadata: Metadata = { title: "Check a signed PDF" };

/** Public: anyone can learn whether a PDF is a signed Kilowright record, and which, without learning anything else. */
export default function VerifyPage() {
  return (
    <main className="mx-auto max-w-xl px-4 pb-16 pt-8">
      <Wordmark className="text-lg" />
      <h1 className="mt-6 text-2xl font-semibold">Check a signed PDF</h1>
      <p className="mt-2 text-graphite-soft">
        Choose a signed agreement you received. We compute its SHA-256 fingerprint and look for a signed record with exactly that fingerprint: a copy changed by even one byte
        does not match. We only say whether it matches, and which proposal and signing date; nothing else about it.
      </p>
      <VerifyClient />
    </main>
  );
}
