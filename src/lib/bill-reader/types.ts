// What the bill reader finds: each value with where it was printed and how sure the reader is.

/** high: a printed label says what the value is; medium: the layout suggests it; low: a guess. */
export type Confidence = "high" | "medium" | "low";
export type Where = { page: number; line: number; text: string };
export type Found<T> = {
  value: T;
  where: Where;
  confidence: Confidence;
  label?: string;
};

export type HistoryMonth = {
  /** YYYY-MM as printed (the year worked out from the bill's dates when not printed). */
  month: string;
  kwh: number;
  /** Days of that bill when printed, else null. */
  days: number | null;
  /** The bill's own dates when the history prints them (date-range rows), else null. */
  start: string | null;
  end: string | null;
  where: Where;
  /** How sure the reader is of this month's figure: the confirm table flags the months that are not "high". */
  confidence: Confidence;
  /** Why it is not sure, in words for the rep ("read past OCR noise", "far from the other months"). */
  note?: string;
};

export type BillHistory = {
  months: HistoryMonth[];
  layout: "table" | "months-across" | "chart";
  confidence: Confidence;
};

export type BillReading = {
  period: {
    start: Found<string>;
    end: Found<string>;
    days: number | null;
  } | null;
  kwh: Found<number> | null;
  /** The meter was not read this time: the utility estimated the period's kWh. */
  estimated: boolean;
  /** In cents. */
  amountDue: Found<number> | null;
  /** Other labelled amounts the rep may mean instead, best first, in cents. */
  amountAlternatives: Found<number>[];
  history: BillHistory | null;
  warnings: string[];
};

export const NUMBER = String.raw`\d{1,3}(?:,\d{3})+(?:\.\d+)?|\d+(?:\.\d+)?`;
export const toNumber = (s: string) => Number(s.replaceAll(",", ""));
export const whereOf = (l: { page: number; line: number; text: string }): Where => ({ page: l.page, line: l.line, text: l.text.slice(0, 160) });
