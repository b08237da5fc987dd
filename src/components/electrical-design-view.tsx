import { Badge, type BadgeTone } from "@/components/ui/badge";
import { SingleLineDiagram } from "@/components/single-line-diagram";
import type { ElectricalDesign } from "@/engine/electrical/design";
import { MATERIAL_NAME, sizeLabel } from "@/engine/electrical/nec-tables";
import type { Drawing } from "@/lib/single-line-diagram";

const TONE: Record<ElectricalDesign["status"], BadgeTone> = { pass: "success", warn: "caution", fail: "danger", incomplete: "caution" };
const WORD: Record<ElectricalDesign["status"], string> = { pass: "Checks pass", warn: "Passes, with warnings", fail: "A check fails", incomplete: "Incomplete" };

/**
 * The electrical design on screen (the Design tab and the job page): status, what is missing,
 * the single-line diagram, each circuit with its conductor and device, the checks that did not
 * pass, and the labels to fit.
 */
export function ElectricalDesignView({ design, drawing, headingId, checkedBy }: { design: ElectricalDesign; drawing: Drawing; headingId: string; checkedBy?: string | null }) {
  const open = design.checks.filter((c) => c.status !== "pass");
  return (
    <section className="card space-y-4 p-4" aria-labelledby={headingId} data-testid="electrical-design">
      <div className="flex flex-wrap items-center gap-2">
        <h2 id={headingId} className="text-lg font-semibold">
          Electrical design and single-line diagram
        </h2>
        <Badge tone={TONE[design.status]} testId="electrical-status">
          {WORD[design.status]}
        </Badge>
        <span className="text-sm text-graphite-soft">NEC {design.edition}</span>
      </div>
      {design.missing.length > 0 ? (
        <p className="text-sm text-caution" data-testid="electrical-missing">
          Missing: {design.missing.join(", ")}. The design stays a draft until these are entered.
        </p>
      ) : null}
      <SingleLineDiagram drawing={drawing} />
      <ul className="space-y-2 text-sm" aria-label="Circuits">
        {design.circuits.map((c) => (
          <li key={c.id}>
            <span className="font-medium">{c.name}</span>:{" "}
            <span className="figure">
              {c.size ? `${c.currentCarrying} × ${sizeLabel(c.size)} ${MATERIAL_NAME[c.material]}` : "no conductor fits"}
              {c.egcSize ? `, EGC ${sizeLabel(c.egcSize)}` : ""}
              {c.conduit?.trade ? `, ${c.conduit.trade} in. EMT` : ""}
              {c.ocpdA ? `, ${c.ocpdA} A OCPD` : ", no OCPD"}
              {c.voltageDropPct !== null ? `, Vd ${c.voltageDropPct} %` : ""}
            </span>
          </li>
        ))}
      </ul>
      {open.length > 0 ? (
        <ul className="space-y-1 text-sm" aria-label="Checks that did not pass" data-testid="electrical-problems">
          {open.map((c) => (
            <li key={c.id}>
              <Badge tone={c.status === "fail" ? "danger" : "caution"}>{c.status}</Badge> {c.detail} <span className="text-graphite-soft">({c.rule})</span>
            </li>
          ))}
        </ul>
      ) : null}
      {design.interconnection && design.interconnection.whenItFails.length > 0 ? (
        <ul className="list-disc pl-5 text-sm" aria-label="What usually follows">
          {design.interconnection.whenItFails.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      ) : null}
      <details className="text-sm">
        <summary className="cursor-pointer">Labels to fit ({design.labels.length})</summary>
        <ul className="mt-2 space-y-1">
          {design.labels.map((l) => (
            <li key={l.id}>
              <span className="font-medium">{l.section}</span> — {l.where}: {l.wording}
            </li>
          ))}
        </ul>
      </details>
      {checkedBy !== undefined ? <p className="text-sm">Checked by: {checkedBy ?? "________________________"} (the company&apos;s designer)</p> : null}
      <p className="text-sm text-graphite-soft">{design.caution}</p>
    </section>
  );
}
