"use client";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { FormMessage } from "@/components/ui/field";
import { CELL_TECHNOLOGY_LABELS, CONSTRUCTION_LABELS, INVERTER_KIND_LABELS } from "@/lib/schemas/catalog";
import { setInverterActiveAction, setModuleActiveAction } from "./actions";
import { CsvColumnsHelp, CsvImport } from "./csv-import";
import { InverterForm } from "./inverter-form";
import { ModuleForm } from "./module-form";
import type { InverterView, ModuleView } from "./catalog-views";

export type { InverterView, ModuleView };

type Notice = { tone: "error" | "success"; text: string } | null;
type Editing<T> = { mode: "new" } | { mode: "edit"; row: T } | null;

const th = "px-3 py-2 font-medium";
const td = "px-3 py-1.5";
const num = "px-3 py-1.5 text-right figure";

export function CatalogClient(props: { canManage: boolean; modules: ModuleView[]; inverters: InverterView[] }) {
  return (
    <div className="mt-6 space-y-10">
      <ModulesSection canManage={props.canManage} modules={props.modules} />
      <InvertersSection canManage={props.canManage} inverters={props.inverters} />
    </div>
  );
}

function StatusCell({ active }: { active: boolean }) {
  return <span className={active ? "text-sage" : "text-graphite-faint"}>{active ? "Active" : "Deactivated"}</span>;
}

/** Runs a server action, refreshes the page data and reports the outcome. */
function useRowAction() {
  const router = useRouter();
  const [notice, setNotice] = useState<Notice>(null);
  const [pending, startTransition] = useTransition();
  function run(task: () => Promise<{ ok: boolean; message?: string }>, done: string) {
    setNotice(null);
    startTransition(async () => {
      const result = await task();
      setNotice(result.ok ? { tone: "success", text: done } : { tone: "error", text: result.message ?? "Not saved." });
      if (result.ok) router.refresh();
    });
  }
  return { notice, setNotice, pending, run };
}

function ModulesSection({ canManage, modules }: { canManage: boolean; modules: ModuleView[] }) {
  const { notice, setNotice, pending, run } = useRowAction();
  const [editing, setEditing] = useState<Editing<ModuleView>>(null);
  return (
    <section aria-labelledby="modules-heading" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="modules-heading" className="text-lg font-semibold">
          Modules <span className="figure text-sm font-normal text-graphite-soft">({modules.length})</span>
        </h2>
        <div className="flex flex-wrap gap-2">
          <a className="btn-quiet" href="/api/module-models/export" download>
            Export modules CSV
          </a>
          {canManage ? (
            <button type="button" className="btn-primary" onClick={() => setEditing({ mode: "new" })} disabled={editing?.mode === "new"}>
              Add module
            </button>
          ) : null}
        </div>
      </div>
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
      {canManage && editing ? (
        <ModuleForm
          key={editing.mode === "edit" ? editing.row.id : "new"}
          row={editing.mode === "edit" ? editing.row : null}
          onClose={() => setEditing(null)}
          onSaved={(text) => {
            setEditing(null);
            setNotice({ tone: "success", text });
          }}
        />
      ) : null}
      {modules.length === 0 ? (
        <p className="text-graphite-soft">{canManage ? "No modules yet. Add one, or import a CSV below." : "No modules are available yet."}</p>
      ) : (
        <div className="overflow-x-auto rounded-card border border-paper-line bg-white">
          <table className="w-full min-w-[960px] text-left text-sm" data-testid="modules-table">
            <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
              <tr>
                <th scope="col" className={th}>Module</th>
                <th scope="col" className={`${th} text-right`}>STC W</th>
                <th scope="col" className={`${th} text-right`}>Voc V</th>
                <th scope="col" className={`${th} text-right`}>Isc A</th>
                <th scope="col" className={`${th} text-right`}>Vmp V</th>
                <th scope="col" className={`${th} text-right`}>Imp A</th>
                <th scope="col" className={`${th} text-right`} title="Temperature coefficient of Pmax">γ Pmax %/°C</th>
                <th scope="col" className={`${th} text-right`} title="Temperature coefficient of Voc">β Voc %/°C</th>
                <th scope="col" className={`${th} text-right`}>Size mm</th>
                <th scope="col" className={th}>Cells · build</th>
                <th scope="col" className={th}>Status</th>
                {canManage ? <th scope="col" className={th}><span className="sr-only">Actions</span></th> : null}
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-line">
              {modules.map((m) => (
                <tr key={m.id} data-testid={`module-${m.model}`} className={m.active ? undefined : "bg-paper/60"}>
                  <td className={td}>
                    <span className="font-medium">{m.manufacturer}</span> {m.model}
                  </td>
                  <td className={num}>{m.stcWatts}</td>
                  <td className={num}>{m.vocV}</td>
                  <td className={num}>{m.iscA}</td>
                  <td className={num}>{m.vmpV}</td>
                  <td className={num}>{m.impA}</td>
                  <td className={num}>{m.gammaPmaxPctPerC}</td>
                  <td className={num}>{m.betaVocPctPerC}</td>
                  <td className={num}>
                    {m.lengthMm}×{m.widthMm}
                  </td>
                  <td className={td}>
                    {CELL_TECHNOLOGY_LABELS[m.cellTechnology]} · {CONSTRUCTION_LABELS[m.construction]}
                    {m.encapsulant ? <span className="text-graphite-soft"> · {m.encapsulant}</span> : null}
                  </td>
                  <td className={td}>
                    <StatusCell active={m.active} />
                  </td>
                  {canManage ? (
                    <td className={`${td} whitespace-nowrap text-right`}>
                      <button type="button" className="btn-quiet" disabled={pending} onClick={() => setEditing({ mode: "edit", row: m })} aria-label={`Edit ${m.manufacturer} ${m.model}`}>
                        Edit
                      </button>{" "}
                      {m.active ? (
                        <button
                          type="button"
                          className="btn-danger"
                          disabled={pending}
                          aria-label={`Deactivate ${m.manufacturer} ${m.model}`}
                          onClick={() => run(() => setModuleActiveAction({ id: m.id, active: false }), `${m.manufacturer} ${m.model} is deactivated: new designs cannot pick it.`)}
                        >
                          Deactivate
                        </button>
                      ) : (
                        <button
                          type="button"
                          className="btn-quiet"
                          disabled={pending}
                          aria-label={`Reactivate ${m.manufacturer} ${m.model}`}
                          onClick={() => run(() => setModuleActiveAction({ id: m.id, active: true }), `${m.manufacturer} ${m.model} is active again.`)}
                        >
                          Reactivate
                        </button>
                      )}
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canManage ? <CsvImport kind="modules" /> : null}
      {canManage ? <CsvColumnsHelp kind="modules" /> : null}
    </section>
  );
}

function inverterInputs(v: InverterView): string {
  if (v.kind === "string") {
    return `MPPT ${v.mpptMinV}–${v.mpptMaxV} V · max ${v.maxDcVoltageV} V DC · ${v.maxInputCurrentA} A × ${v.mpptCount} MPPT`;
  }
  return `DC ${v.dcInputMinV}–${v.dcInputMaxV} V · ${v.modulesPerUnit} module${v.modulesPerUnit === 1 ? "" : "s"} per unit`;
}

function InvertersSection({ canManage, inverters }: { canManage: boolean; inverters: InverterView[] }) {
  const { notice, setNotice, pending, run } = useRowAction();
  const [editing, setEditing] = useState<Editing<InverterView>>(null);
  return (
    <section aria-labelledby="inverters-heading" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id="inverters-heading" className="text-lg font-semibold">
          Inverters <span className="figure text-sm font-normal text-graphite-soft">({inverters.length})</span>
        </h2>
        <div className="flex flex-wrap gap-2">
          <a className="btn-quiet" href="/api/inverter-models/export" download>
            Export inverters CSV
          </a>
          {canManage ? (
            <button type="button" className="btn-primary" onClick={() => setEditing({ mode: "new" })} disabled={editing?.mode === "new"}>
              Add inverter
            </button>
          ) : null}
        </div>
      </div>
      {notice ? <FormMessage tone={notice.tone}>{notice.text}</FormMessage> : null}
      {canManage && editing ? (
        <InverterForm
          key={editing.mode === "edit" ? editing.row.id : "new"}
          row={editing.mode === "edit" ? editing.row : null}
          onClose={() => setEditing(null)}
          onSaved={(text) => {
            setEditing(null);
            setNotice({ tone: "success", text });
          }}
        />
      ) : null}
      {inverters.length === 0 ? (
        <p className="text-graphite-soft">{canManage ? "No inverters yet. Add one, or import a CSV below." : "No inverters are available yet."}</p>
      ) : (
        <div className="overflow-x-auto rounded-card border border-paper-line bg-white">
          <table className="w-full min-w-[840px] text-left text-sm" data-testid="inverters-table">
            <thead className="bg-paper-deep text-xs uppercase tracking-wide text-graphite-soft">
              <tr>
                <th scope="col" className={th}>Inverter</th>
                <th scope="col" className={th}>Kind</th>
                <th scope="col" className={`${th} text-right`}>AC W</th>
                <th scope="col" className={`${th} text-right`}>Eff. %</th>
                <th scope="col" className={th}>DC input</th>
                <th scope="col" className={th}>Status</th>
                {canManage ? <th scope="col" className={th}><span className="sr-only">Actions</span></th> : null}
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-line">
              {inverters.map((v) => (
                <tr key={v.id} data-testid={`inverter-${v.model}`} className={v.active ? undefined : "bg-paper/60"}>
                  <td className={td}>
                    <span className="font-medium">{v.manufacturer}</span> {v.model}
                  </td>
                  <td className={td}>{INVERTER_KIND_LABELS[v.kind]}</td>
                  <td className={num}>{v.acWatts}</td>
                  <td className={num}>{v.efficiencyPct}</td>
                  <td className={`${td} figure text-xs`}>{inverterInputs(v)}</td>
                  <td className={td}>
                    <StatusCell active={v.active} />
                  </td>
                  {canManage ? (
                    <td className={`${td} whitespace-nowrap text-right`}>
                      <button type="button" className="btn-quiet" disabled={pending} onClick={() => setEditing({ mode: "edit", row: v })} aria-label={`Edit ${v.manufacturer} ${v.model}`}>
                        Edit
                      </button>{" "}
                      {v.active ? (
                        <button
                          type="button"
                          className="btn-danger"
                          disabled={pending}
                          aria-label={`Deactivate ${v.manufacturer} ${v.model}`}
                          onClick={() => run(() => setInverterActiveAction({ id: v.id, active: false }), `${v.manufacturer} ${v.model} is deactivated: new designs cannot pick it.`)}
                        >
                          Deactivate
                        </button>
                      ) : (
                        <button
                          type="button"
                          className="btn-quiet"
                          disabled={pending}
                          aria-label={`Reactivate ${v.manufacturer} ${v.model}`}
                          onClick={() => run(() => setInverterActiveAction({ id: v.id, active: true }), `${v.manufacturer} ${v.model} is active again.`)}
                        >
                          Reactivate
                        </button>
                      )}
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canManage ? <CsvImport kind="inverters" /> : null}
      {canManage ? <CsvColumnsHelp kind="inverters" /> : null}
    </section>
  );
}
