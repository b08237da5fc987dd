"use client";
import { z } from "zod";

// zod 4 probes `new Function("")` to decide whether it may compile parsers; under our CSP (no
// 'unsafe-eval', src/proxy.ts) the probe is blocked and reported as a violation even though zod
// then falls back. In the browser, tell it not to try (zod's `jitless` setting). The server keeps
// the compiled parsers.
if (typeof window !== "undefined") z.config({ jitless: true });

export function ZodJitless(): null {
  return null;
}
