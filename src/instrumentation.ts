// Runs once when an app process starts (Next's instrumentation hook). Each Node process runs the
// mail worker, which sends what the transactional outbox holds (src/server/outbound-mail.ts),
// including mail a killed or restarted process left unsent.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  // `next build` loads this file too; the worker needs a configured, running instance.
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startMailWorker } = await import("@/server/outbound-mail");
  startMailWorker();
}
