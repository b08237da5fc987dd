/** Kilowright's wordmark: the name with a copper "k" bar. Our own, drawn in CSS. */
export function Wordmark({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight ${className}`}>
      <span aria-hidden className="inline-block h-5 w-1.5 rounded-sm bg-copper" />
      Kilowright
    </span>
  );
}
