import type { CorpusBill } from "./types";

/** Bills written after the reader was finished, to measure it on layouts it was not tuned on. */
export const heldOut: CorpusBill[] = [];
