"use client";
import { useState, type FormEvent } from "react";
import { FormMessage } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { MAX_VERIFY_FILE_BYTES } from "@/lib/schemas/proposal";

type Answer = { match: true; label: string; signedOn: string } | { match: false };

/** As the server checks. */
const MAX_BYTES = MAX_VERIFY_FILE_BYTES;

export function VerifyClient() {
  const [file, setFile] = useState<File | null>(null);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent) {
    e.preventDefault();
    setAnswer(null);
    setError(null);
    if (!file) return setError("Choose a PDF file");
    if (file.size > MAX_BYTES) return setError("Files up to 25 MB are checked.");
    setBusy(true);
    try {
      const form = new FormData();
      form.set("file", file);
      const res = await fetch("/api/public/verify", { method: "POST", body: form });
      const body = (await res.json().catch(() => null)) as { data?: Answer; error?: { code: string; message: string } } | null;
      if (!res.ok || !body?.data) throw new ApiError(res.status, body?.error?.code ?? "http_error", body?.error?.message ?? `The server answered ${res.status}.`);
      setAnswer(body.data);
    } catch (err) {
      setError(err instanceof Error ? err.message : "The file could not be checked.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form className="card mt-6 space-y-4 p-4" onSubmit={submit} noValidate>
      <div>
        <label htmlFor="verify-file" className="field-label">
          Signed PDF
        </label>
        <input
          id="verify-file"
          type="file"
          accept="application/pdf,.pdf"
          className="block w-full text-sm file:mr-3 file:min-h-touch file:rounded-md file:border file:border-paper-line file:bg-white file:px-4"
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setAnswer(null);
            setError(null);
          }}
        />
      </div>
      <button type="submit" className="btn-primary w-full" disabled={busy}>
        {busy ? "Checking…" : "Check the file"}
      </button>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      {answer ? (
        answer.match ? (
          <FormMessage tone="success">
            <span data-testid="verify-answer">
              This file matches proposal {answer.label}, signed on {answer.signedOn} (UTC).
            </span>
          </FormMessage>
        ) : (
          <FormMessage tone="info">
            <span data-testid="verify-answer">No signed Kilowright record matches this file.</span>
          </FormMessage>
        )
      ) : null}
    </form>
  );
}
