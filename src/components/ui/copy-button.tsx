"use client";
import { useState } from "react";

/** Copies a text (an address, a link) to the clipboard and says so on the button. */
export function CopyButton({ text, label, copiedLabel, className = "btn-quiet" }: { text: string; label: string; copiedLabel: string; className?: string }) {
  const [copied, setCopied] = useState(false);
  return (
    <button
      type="button"
      className={className}
      onClick={async () => {
        await navigator.clipboard.writeText(text).catch(() => undefined);
        setCopied(true);
      }}
    >
      {copied ? copiedLabel : label}
    </button>
  );
}
