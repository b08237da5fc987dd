import { describe, expect, it } from "vitest";
import { HttpError } from "@/server/errors";
import { makeOcrQueue } from "./ocr-queue";

describe("the OCR queue", () => {
  it("runs one at a time and refuses a line longer than allowed, naming the wait", async () => {
    const inQueue = makeOcrQueue({ concurrency: 1, maxWaiting: 2 });
    let running = 0;
    let most = 0;
    const order: number[] = [];
    const job = (n: number) => async () => {
      running++;
      most = Math.max(most, running);
      await new Promise((r) => setTimeout(r, 20));
      order.push(n);
      running--;
      return n;
    };
    const first = inQueue(job(1)); // runs
    const second = inQueue(job(2)); // waits
    const third = inQueue(job(3)); // waits
    const refused = await inQueue(job(4)).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(HttpError);
    expect((refused as HttpError).status).toBe(503);
    expect((refused as HttpError).message).toMatch(/being read for 3 uploads right now; try this one again in a minute/);
    expect(await Promise.all([first, second, third])).toEqual([1, 2, 3]);
    expect([most, order]).toEqual([1, [1, 2, 3]]);
    // The line is short again: a new one is taken.
    expect(await inQueue(job(5))).toBe(5);
  });
});
