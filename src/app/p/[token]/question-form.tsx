"use client";
import { useState, type FormEvent } from "react";
import { FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { ApiError } from "@/lib/api-client";

/** Ask the rep a question; it is kept with the proposal and e-mailed to them. */
export function QuestionForm({ token, repName }: { token: string; repName: string }) {
  const [question, setQuestion] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [sent, setSent] = useState(false);
  // The refusal belongs to the one field (its own message, or the request's).
  const ask = useSave<string>({
    request: (text) => ({ url: `/api/public/proposals/${token}/question`, method: "POST", json: { question: text } }),
    refresh: false,
    onError: (err) => setError(err instanceof ApiError && err.fields?.question ? err.fields.question[0] : err.message),
    onSaved: () => {
      setSent(true);
      setQuestion("");
    },
  });

  function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    if (question.trim().length < 3) {
      setError("Write your question");
      return;
    }
    ask.save(question.trim());
  }

  return (
    <section aria-labelledby="question-heading" className="card p-4">
      <h2 id="question-heading" className="text-lg font-semibold">
        Ask {repName} a question
      </h2>
      <form className="mt-3 space-y-3" onSubmit={submit} noValidate>
        <div>
          <label htmlFor="question" className="field-label">
            Your question
          </label>
          <textarea
            id="question"
            className="field-input min-h-28 py-2"
            maxLength={2000}
            value={question}
            onChange={(e) => {
              setQuestion(e.target.value);
              setSent(false);
            }}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? "question-error" : undefined}
          />
          {error ? (
            <p id="question-error" className="field-error" role="alert">
              {error}
            </p>
          ) : null}
        </div>
        <button type="submit" className="btn-quiet w-full" disabled={ask.pending}>
          Send question
        </button>
        {sent ? <FormMessage tone="success">Sent. {repName} answers by e-mail.</FormMessage> : null}
      </form>
    </section>
  );
}
