"use client";
import { useState, type FormEvent } from "react";
import { FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { MAX_VERIFY_FILE_BYTES } from "@/lib/schemas/proposal";

type Answer = { match: true; label: string; signedOn: string } | { match: false };

/** As the server checks. */
const MAX_BYTES = MAX_VERIFY_FILE_BYTES;

export function VerifyClient() {
  const [file, setFile] = useState<File | null>(null);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [error, setError] = useState<string | null>(null);
  // Nothing on this page changes: the answer is shown, no refresh.
  const check = useSave<File, Answer>({
    request: (pdf) => {
      const body = new FormData();
      body.set("file", pdf);
      return { url: "/api/public/verify", method: "POST", body };
    },
    refresh: false,
    notify: (n) => setError(n?.tone === "error" ? n.text : null),
    onSaved: setAnswer,
  });

  function submit(e: FormEvent) {
    e.preventDefault();
    setAnswer(null);
    setError(null);
    if (!file) return setError("Choose a PDF file");
    if (file.size > MAX_BYTES) return setError("Files up to 25 MB are checked.");
    check.save(file);
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
      <button type="submit" className="btn-primary w-full" disabled={check.pending}>
        {check.pending ? "Checking…" : "Check the file"}
      </button>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      {answer ? (
        answer.match ? (
          <FormMessage tone="success">
            <span data-testid="verify-answer">
              This file matches proposal {answer.label}, signed on {answer.signedOn}.
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
