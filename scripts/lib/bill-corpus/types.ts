import type { BillJson } from "../../../src/lib/bill-reader";

/** An invented bill: what it prints (the truth the reader must find) and how it is drawn. */
export type CorpusBill = {
  name: string;
  /** The reader's answer as the command prints it; `warnings` lists words some warning must contain. */
  expected: BillJson;
  make: () => Promise<Uint8Array>;
};
