"use client";
import { useLocale, useTranslations } from "next-intl";
import { useState, type FormEvent } from "react";
import { useHomeownerError } from "@/components/homeowner-errors";
import { FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { ApiError } from "@/lib/api-client";

/** Ask the rep a question; it is kept with the proposal and e-mailed to them. */
export function QuestionForm({ token, repName }: { token: string; repName: string }) {
  const [question, setQuestion] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [sent, setSent] = useState(false);
  const t = useTranslations("page.question");
  const errorText = useHomeownerError();
  const locale = useLocale();
  // The refusal belongs to the one field (its own message, or the request's).
  const ask = useSave<string>({
    request: (text) => ({ url: `/api/public/proposals/${token}/question`, method: "POST", json: { question: text } }),
    refresh: false,
    onError: (err) => setError(err instanceof ApiError && err.fields?.question && locale === "en" ? err.fields.question[0] : errorText(err)),
    onSaved: () => {
      setSent(true);
      setQuestion("");
    },
  });

  function submit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    if (question.trim().length < 3) {
      setError(t("empty"));
      return;
    }
    ask.save(question.trim());
  }

  return (
    <section aria-labelledby="question-heading" className="card p-4">
      <h2 id="question-heading" className="text-lg font-semibold">
        {t("heading", { rep: repName })}
      </h2>
      <form className="mt-3 space-y-3" onSubmit={submit} noValidate>
        <div>
          <label htmlFor="question" className="field-label">
            {t("label")}
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
          {t("send")}
        </button>
        {sent ? <FormMessage tone="success">{t("sent", { rep: repName })}</FormMessage> : null}
      </form>
    </section>
  );
}
