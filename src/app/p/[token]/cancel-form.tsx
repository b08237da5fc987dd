"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { StatusMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";

/** "Cancel this agreement", with a second step so a stray tap cancels nothing. Shown only inside the window. */
export function CancelForm({ token, deadlineText }: { token: string; deadlineText: string }) {
  const [confirming, setConfirming] = useState(false);
  const t = useTranslations("page.cancel");
  // On success the page shows the cancelled agreement (router.refresh).
  const cancel = useSave<void>({ request: () => ({ url: `/api/public/proposals/${token}/cancel`, method: "POST" }) });
  const busy = cancel.pending;

  if (!confirming) {
    return (
      <button type="button" className="btn-danger w-full" onClick={() => setConfirming(true)}>
        {t("button")}
      </button>
    );
  }
  return (
    <div className="space-y-3 rounded-md border border-danger/30 bg-danger-light p-3" role="group" aria-label={t("confirmGroup")}>
      <p className="text-sm">{t("confirmText", { deadline: deadlineText })}</p>
      <div className="flex flex-col gap-2 sm:flex-row">
        <button type="button" className="btn-danger flex-1" onClick={() => cancel.save()} disabled={busy}>
          {t("yes")}
        </button>
        <button type="button" className="btn-quiet flex-1" onClick={() => setConfirming(false)} disabled={busy}>
          {t("keep")}
        </button>
      </div>
      <StatusMessage notice={cancel.notice} />
    </div>
  );
}
