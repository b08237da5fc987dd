import { formatCents } from "@/lib/format";
import type { PacketMaterials } from "@/lib/job-materials";
import { RoofLayoutSketch } from "./roof-layout-sketch";
import { TableShell, Td, Th } from "./table";

const qty = (n: number, unit: string) => (unit === "m" ? `${n} m` : String(n));

/** The full bill of materials: quantity with spares, how it was counted, and the price where the price book has one. */
export function BomTable({ materials }: { materials: PacketMaterials }) {
  const { bom } = materials;
  return (
    <div className="space-y-2">
      {bom.problems.length > 0 ? (
        <ul className="space-y-1 rounded-card bg-caution-light p-3 text-sm text-caution" data-testid="bom-problems">
          {bom.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      ) : null}
      <TableShell testId="bom" label="Bill of materials" minWidth={560} alignTop head={
        <>
          <Th>Item</Th>
          <Th numeric>Quantity</Th>
          <Th priority="low">How counted</Th>
          <Th numeric priority="low">Price</Th>
        </>
      }>
        {bom.lines.map((l, i) => (
          <tr key={i} data-kind={l.kind}>
            <Td>
              <span className="font-medium">{l.item}</span>
              <span className="block text-graphite-soft wrap-anywhere">{l.detail}</span>
            </Td>
            <Td numeric>
              {qty(l.quantity, l.unit)}
              {l.spares > 0 ? <span className="block text-xs text-graphite-soft">incl. {qty(l.spares, l.unit)} spare</span> : null}
            </Td>
            <Td priority="low" className="text-xs text-graphite-soft wrap-anywhere">
              {l.basis}
            </Td>
            <Td numeric priority="low">
              {l.totalCents === null ? "—" : formatCents(l.totalCents)}
            </Td>
          </tr>
        ))}
      </TableShell>
      <p className="text-sm text-graphite-soft">
        Priced parts: {formatCents(bom.totalCents)}
        {bom.unpriced > 0 ? ` (${bom.unpriced} lines have no price book line item)` : ""}.
      </p>
    </div>
  );
}

/** Each face's layout sketch with the fire-code edition and what the face cannot hold. */
export function RoofLayouts({ materials }: { materials: PacketMaterials }) {
  return (
    <div className="space-y-4" data-testid="roof-layouts">
      <p className="text-sm">
        Pathways and setbacks: <span className="font-medium">{materials.fireCode.label}</span>; {materials.fireCode.ridgeSetbackNote}.
      </p>
      {materials.faces.map((f) => (
        <div key={f.name} className="space-y-2">
          <h3 className="font-semibold">{f.name}</h3>
          {f.notes.map((n) => (
            <p key={n} className="rounded-card bg-caution-light p-2 text-sm text-caution" data-testid="face-warning">
              {n}
            </p>
          ))}
          <RoofLayoutSketch face={f} />
        </div>
      ))}
    </div>
  );
}

export function MaterialsCautions({ materials }: { materials: PacketMaterials }) {
  return (
    <ul className="list-disc space-y-1 pl-5 text-sm text-graphite-soft">
      {materials.cautions.map((c) => (
        <li key={c}>{c}</li>
      ))}
    </ul>
  );
}

/** The roof layout section and the bill of materials section, as the job page and the Design tab show them. */
export function MaterialsSections({ materials, idPrefix }: { materials: PacketMaterials; idPrefix: string }) {
  return (
    <>
      <section className="card p-4" aria-labelledby={`${idPrefix}-layout-heading`} data-testid="roof-layout-section">
        <h2 id={`${idPrefix}-layout-heading`} className="mb-2 text-lg font-semibold">
          Roof layout
        </h2>
        <RoofLayouts materials={materials} />
      </section>
      <section className="card p-4" aria-labelledby={`${idPrefix}-bom-heading`}>
        <h2 id={`${idPrefix}-bom-heading`} className="mb-2 text-lg font-semibold">
          Bill of materials
        </h2>
        <BomTable materials={materials} />
        <div className="mt-3">
          <MaterialsCautions materials={materials} />
        </div>
      </section>
    </>
  );
}
