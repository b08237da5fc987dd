import "server-only";
import pLimit from "p-limit";
import { HttpError } from "@/server/errors";

/**
 * OCR runs one at a time in each app process, the rest wait their turn (our choice: tesseract
 * keeps a core busy for seconds a page; one at a time leaves the other core to the app's
 * requests). A long line is refused rather than left to grow: the rep is told to try again.
 */
export function makeOcrQueue(opts: { concurrency: number; maxWaiting: number }) {
  const limit = pLimit(opts.concurrency);
  return async function inQueue<T>(work: () => Promise<T>): Promise<T> {
    if (limit.pendingCount >= opts.maxWaiting) {
      throw new HttpError(
        503,
        "ocr_busy",
        `Bill photos are being read for ${limit.activeCount + limit.pendingCount} uploads right now; try this one again in a minute (nothing was saved).`,
      );
    }
    return limit(work);
  };
}

/** The app's queue: one OCR at a time, at most 6 waiting (our choice). */
export const inOcrQueue = makeOcrQueue({ concurrency: 1, maxWaiting: 6 });
