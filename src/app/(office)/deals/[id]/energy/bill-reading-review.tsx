"use client";
import { FIGURE_CHARS, figureWidth } from "@/components/ui/number-input";
import { useState } from "react";
import { Badge, type BadgeTone } from "@/components/ui/badge";
import { FormMessage } from "@/components/ui/field";
import { RadioGroup } from "@/components/ui/radio-group";
import { TableShell, Td, Th } from "@/components/ui/table";
import type { BillReading, Confidence, Found, HistoryMonth, Where } from "@/lib/bill-reader";
import { billsFromReading, type BillTableRow } from "@/lib/bill-reader/to-bills";

const SURE: Record<Confidence, [BadgeTone, string]> = {
  high: ["success", "labelled"],
  medium: ["caution", "check"],
  low: ["danger", "guess"],
};
const money = (cents: number) => (cents / 100).toFixed(2);
const parseNumber = (s: string) => (s.trim() === "" ? Number.NaN : Number(s.replace(/[$,\s]/g, "")));
const monthName = (ym: string) =>
  new Date(`${ym}-15T00:00:00Z`).toLocaleDateString("en-US", {
    month: "short",
    year: "numeric",
    timeZone: "UTC",
  });

function WhereCell({ where, confidence, note }: { where: Where | undefined; confidence: Confidence | undefined; note?: string }) {
  if (!where || !confidence) return <Td className="text-graphite-soft">not found — type it from the bill</Td>;
  const [tone, word] = SURE[confidence];
  return (
    <Td>
      <Badge tone={tone}>{word}</Badge>{" "}
      <span className="text-xs text-graphite-soft">
        page {where.page}, line {where.line}: “{where.text}”
      </span>
      {note ? <span className="block text-sm text-caution">Not sure: {note}.</span> : null}
    </Td>
  );
}

type Draft = {
  start: string;
  end: string;
  kwh: string;
  amount: string;
  /** The history's months as read, each kWh as the rep edits it (text). */
  months: (Omit<HistoryMonth, "kwh"> & { kwh: string })[];
  useHistory: boolean;
  /** The rep ticked that the months the reader is unsure of were compared with the bill. */
  checkedUnsure: boolean;
};

/** Months the reader is not sure of: flagged in the table, and saved only once the rep says they were compared. */
const unsureMonths = (d: Draft) => (d.useHistory ? d.months.filter((m) => m.confidence !== "high") : []);

function draftOf(r: BillReading): Draft {
  return {
    start: r.period?.start.value ?? "",
    end: r.period?.end.value ?? "",
    kwh: r.kwh ? String(r.kwh.value) : "",
    amount: r.amountDue ? money(r.amountDue.value) : "",
    months: (r.history?.months ?? []).map((m) => ({
      ...m,
      kwh: String(m.kwh),
    })),
    useHistory: !!r.history?.months.length,
    checkedUnsure: false,
  };
}

/** The rows the rep's confirmed values make, or the first problem with them. */
function toRows(d: Draft): { rows: BillTableRow[] } | { problem: string } {
  const hasCurrent = d.start || d.end || d.kwh;
  const kwh = parseNumber(d.kwh);
  const amount = d.amount.trim() === "" ? null : Math.round(parseNumber(d.amount) * 100);
  if (hasCurrent && (!d.start || !d.end || !(d.end > d.start)))
    return {
      problem: "Give this bill's period: a start date and a later end date.",
    };
  if (hasCurrent && !(kwh > 0)) return { problem: "Give this bill's kWh (a number above 0)." };
  if (amount !== null && !(amount >= 0)) return { problem: "The amount due is a dollar figure like 142.91." };
  const unsure = unsureMonths(d);
  if (unsure.length && !d.checkedUnsure)
    return {
      problem: `Compare ${unsure.map((m) => monthName(m.month)).join(", ")} with the bill (the reader is not sure of ${unsure.length === 1 ? "it" : "them"}), correct what differs and tick that you did, or leave the history out.`,
    };
  const months = d.useHistory ? d.months.map((m) => ({ ...m, kwh: parseNumber(m.kwh) })) : [];
  const bad = months.find((m) => !(m.kwh > 0));
  if (bad)
    return {
      problem: `Give the kWh for ${monthName(bad.month)} (a number above 0), or leave the history out.`,
    };
  const rows = billsFromReading(hasCurrent ? { start: d.start, end: d.end, kwh, amountDueCents: amount } : null, months);
  return rows.length ? { rows } : { problem: "Nothing to save: type the bill's period and kWh." };
}

type SetDraft = (patch: Partial<Draft>) => void;

/** The amount due, and every other labelled amount to pick from when there are some: a wrong one is never taken unseen. */
function AmountChoice({ draft: d, set, amounts }: { draft: Draft; set: SetDraft; amounts: Found<number>[] }) {
  return (
    <>
      <input aria-label="Amount due" inputMode="decimal" className="field-input figure" style={figureWidth(FIGURE_CHARS.money)} value={d.amount} onChange={(e) => set({ amount: e.target.value })} />
      {amounts.length > 1 ? (
        <div className="mt-2" data-testid="amount-alternatives">
          <RadioGroup
            name="amount-choice"
            label="Which amount is due now?"
            legend
            options={amounts.map((a) => [money(a.value), `$${money(a.value)} · ${a.label ?? ""}`] as const)}
            value={d.amount}
            onChange={(v) => set({ amount: v })}
          />
        </div>
      ) : null}
    </>
  );
}

/** The history's months, each a row of the same table, filled into the usage year in one step. */
function HistoryRows({ draft: d, set }: { draft: Draft; set: SetDraft }) {
  const unsure = unsureMonths(d);
  return (
    <>
      {d.months.length ? (
        <tr>
          <Td colSpan={3}>
            <label className="flex min-h-touch items-center gap-3 font-medium">
              <input type="checkbox" className="h-5 w-5 accent-copper" checked={d.useHistory} onChange={(e) => set({ useHistory: e.target.checked })} />
              Fill the usage year from the bill&apos;s history ({d.months.length} months; monthly totals
              {d.months.every((m) => m.start) ? "" : ", days and period ends estimated"})
            </label>
          </Td>
        </tr>
      ) : null}
      {d.useHistory
        ? d.months.map((m, i) => (
            <tr key={m.month} data-testid="history-month" data-unsure={m.confidence !== "high" ? "true" : undefined}>
              <Td>
                {monthName(m.month)}
                {m.days ? ` · ${m.days} days` : ""}
              </Td>
              <Td>
                <input
                  aria-label={`${monthName(m.month)} kWh`}
                  inputMode="decimal"
                  className="field-input figure"
                  style={figureWidth(FIGURE_CHARS.kwh)}
                  value={m.kwh}
                  onChange={(e) =>
                    set({
                      months: d.months.map((x, j) => (j === i ? { ...x, kwh: e.target.value } : x)),
                    })
                  }
                />
              </Td>
              <WhereCell where={m.where} confidence={m.confidence} note={m.note} />
            </tr>
          ))
        : null}
      {unsure.length ? (
        <tr>
          <Td colSpan={3}>
            <label className="flex min-h-touch items-center gap-3 font-medium" data-testid="history-checked">
              <input type="checkbox" className="h-5 w-5 accent-copper" checked={d.checkedUnsure} onChange={(e) => set({ checkedUnsure: e.target.checked })} />
              I compared the {unsure.length} flagged {unsure.length === 1 ? "month" : "months"} ({unsure.map((m) => monthName(m.month)).join(", ")}) with the bill
            </label>
          </Td>
        </tr>
      ) : null}
    </>
  );
}

/** The current period's dates and kWh, each with where it was printed. */
function PeriodRows({ reading: r, draft: d, set }: { reading: BillReading; draft: Draft; set: SetDraft }) {
  return (
    <>
      {(
        [
          ["Period from", "start", r.period?.start],
          ["Period to", "end", r.period?.end],
        ] as const
      ).map(([label, key, found]) => (
        <tr key={key}>
          <Td>{label}</Td>
          <Td>
            <input type="date" aria-label={label} className="field-input" value={d[key]} onChange={(e) => set({ [key]: e.target.value })} />
          </Td>
          <WhereCell where={found?.where} confidence={found?.confidence} />
        </tr>
      ))}
      <tr>
        <Td>
          kWh
          {r.estimated ? (
            <Badge tone="caution" className="ml-1">
              estimated reading
            </Badge>
          ) : null}
        </Td>
        <Td>
          <input aria-label="Period kWh" inputMode="decimal" className="field-input figure" style={figureWidth(FIGURE_CHARS.kwh)} value={d.kwh} onChange={(e) => set({ kwh: e.target.value })} />
        </Td>
        <WhereCell where={r.kwh?.where} confidence={r.kwh?.confidence} />
      </tr>
    </>
  );
}

/**
 * What was read from a bill, in one table to confirm or correct before anything is saved: the
 * period, kWh and amount due with where each was printed, the amount's alternatives, and the
 * usage history's months (saved as bills marked "from the bill's history").
 */
export function BillReadingReview(props: { reading: BillReading; source: "text" | "ocr"; saving: boolean; onSave: (rows: BillTableRow[]) => void; onDismiss: () => void }) {
  const r = props.reading;
  const [d, setD] = useState<Draft>(() => draftOf(r));
  const [problem, setProblem] = useState<string | null>(null);
  const set = (patch: Partial<Draft>) => setD((x) => ({ ...x, ...patch }));
  const amounts: Found<number>[] = r.amountDue ? [r.amountDue, ...r.amountAlternatives] : [];

  function save() {
    const out = toRows(d);
    if ("problem" in out) return setProblem(out.problem);
    setProblem(null);
    props.onSave(out.rows);
  }

  return (
    <div className="mt-4 space-y-3" data-testid="bill-reading" data-source={props.source}>
      {props.source === "ocr" ? (
        <p className="text-sm text-graphite-soft">
          <Badge tone="caution">source: ocr</Badge> Read from a picture of the bill: OCR can mistake a digit, so compare each figure with the bill.
        </p>
      ) : null}
      <TableShell
        label="Read from the bill"
        alignTop
        head={
          <>
            <Th>On the bill</Th>
            <Th>Value</Th>
            <Th>Where it was found</Th>
          </>
        }
      >
        <PeriodRows reading={r} draft={d} set={set} />
        <tr>
          <Td>Amount due ($)</Td>
          <Td>
            <AmountChoice draft={d} set={set} amounts={amounts} />
          </Td>
          <WhereCell where={r.amountDue?.where} confidence={r.amountDue?.confidence} />
        </tr>
        <HistoryRows draft={d} set={set} />
      </TableShell>
      {r.warnings.length ? (
        <ul className="space-y-1 text-sm text-caution" aria-label="What to check">
          {r.warnings.map((w) => (
            <li key={w}>⚑ {w}</li>
          ))}
        </ul>
      ) : null}
      {problem ? <FormMessage tone="error">{problem}</FormMessage> : null}
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-primary" onClick={save} disabled={props.saving}>
          {props.saving ? "Saving…" : "Save to the bills"}
        </button>
        <button type="button" className="btn-quiet" onClick={props.onDismiss}>
          Dismiss
        </button>
      </div>
    </div>
  );
}
