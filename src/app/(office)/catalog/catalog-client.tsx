"use client";
import { optionsOf } from "@/components/ui/field";
import {
  CELL_TECHNOLOGIES,
  CELL_TECHNOLOGY_LABELS,
  COEFFICIENT_UNITS,
  CONSTRUCTION_LABELS,
  CONSTRUCTIONS,
  INVERTER_KIND_LABELS,
  INVERTER_KINDS,
  inverterModelSchema,
  moduleModelSchema,
  type InverterModelInput,
  type ModuleModelInput,
} from "@/lib/schemas/catalog";
import type { InverterView, ModuleView } from "./catalog-views";
import type { EquipmentFormSpec, NumberField } from "./equipment-form";
import { EquipmentSection, type Column } from "./equipment-section";

export type { InverterView, ModuleView };

const MODULE_NUMBERS: NumberField<ModuleModelInput>[] = [
  { name: "stcWatts", label: "STC watts (W)", step: "any" },
  { name: "vocV", label: "Voc (V)", step: "any" },
  { name: "iscA", label: "Isc (A)", step: "any" },
  { name: "vmpV", label: "Vmp (V)", step: "any" },
  { name: "impA", label: "Imp (A)", step: "any" },
  { name: "gammaPmaxPctPerC", label: "Pmax temperature coefficient (%/°C)", step: "any" },
  { name: "vocCoeff.value", label: "Voc temperature coefficient", step: "any" },
  { name: "maxSeriesFuseA", label: "Maximum series fuse (A, optional)", step: "any" },
  { name: "lengthMm", label: "Length (mm)", step: "1" },
  { name: "widthMm", label: "Width (mm)", step: "1" },
];

const MODULE_SPEC = {
  noun: "module",
  collection: "/api/module-models",
  schema: moduleModelSchema,
  defaults: (row) =>
    row
      ? { ...row, encapsulant: row.encapsulant ?? "" }
      : { manufacturer: "", model: "", cellTechnology: "topcon", construction: "glass_glass", encapsulant: "", vocCoeff: { unit: "%/°C" } as ModuleModelInput["vocCoeff"] },
  description: () =>
    "Datasheet values at STC. Temperature coefficients are negative: Pmax in %/°C, Voc in the unit the datasheet uses (%/°C, mV/°C or V/°C). The maximum series fuse rating decides whether parallel strings need fuses (NEC 690.9(A)).",
  headChoices: [],
  numbers: () => MODULE_NUMBERS,
  numberColumns: "lg:grid-cols-5",
  tailChoices: [
    { name: "vocCoeff.unit", label: "Voc coefficient unit", options: COEFFICIENT_UNITS.map((u) => ({ value: u, label: u })) },
    { name: "cellTechnology", label: "Cell technology", options: optionsOf(CELL_TECHNOLOGIES, CELL_TECHNOLOGY_LABELS) },
    { name: "construction", label: "Construction", options: optionsOf(CONSTRUCTIONS, CONSTRUCTION_LABELS) },
  ],
  tailTexts: [{ name: "encapsulant", label: "Encapsulant (optional)" }],
} satisfies EquipmentFormSpec<ModuleModelInput>;

const INVERTER_COMMON: NumberField<InverterModelInput>[] = [
  { name: "acWatts", label: "AC watts (W)", step: "any" },
  { name: "efficiencyPct", label: "Efficiency (%)", step: "any" },
];
const STRING_FIELDS = [
  { name: "maxDcVoltageV", label: "Max DC voltage (V)", step: "any" },
  { name: "mpptMinV", label: "MPPT minimum (V)", step: "any" },
  { name: "mpptMaxV", label: "MPPT maximum (V)", step: "any" },
  { name: "maxInputCurrentA", label: "Max input current per MPPT (A)", step: "any" },
  { name: "mpptCount", label: "MPPT count", step: "1" },
] as NumberField<InverterModelInput>[];
const MICRO_FIELDS = [
  { name: "dcInputMinV", label: "DC input minimum (V)", step: "any" },
  { name: "dcInputMaxV", label: "DC input maximum (V)", step: "any" },
  { name: "modulesPerUnit", label: "Modules per unit", step: "1" },
] as NumberField<InverterModelInput>[];

const INVERTER_SPEC: EquipmentFormSpec<InverterModelInput> = {
  noun: "inverter",
  collection: "/api/inverter-models",
  schema: inverterModelSchema,
  // The stored inverter as form values: the other kind's empty fields are left out.
  defaults: (row) =>
    row
      ? (Object.fromEntries(Object.entries(row).filter(([k, v]) => v !== null && k !== "id" && k !== "active")) as Partial<InverterModelInput>)
      : { kind: "string", manufacturer: "", model: "" },
  description: (v) =>
    v.kind === "micro"
      ? "A microinverter: its DC input range and how many modules one unit takes."
      : "A string inverter: the MPPT window must sit inside the max DC voltage (600 V for one- and two-family dwellings, NEC 690.7).",
  headChoices: [{ name: "kind", label: "Kind", options: optionsOf(INVERTER_KINDS, INVERTER_KIND_LABELS) }],
  numbers: (v) => [...INVERTER_COMMON, ...(v.kind === "micro" ? MICRO_FIELDS : STRING_FIELDS)],
  numberColumns: "lg:grid-cols-4",
  tailChoices: [],
  tailTexts: [],
};

const MODULE_COLUMNS: Column<ModuleView>[] = [
  { header: "STC W", numeric: true, cell: (m) => m.stcWatts },
  { header: "Voc V", numeric: true, cell: (m) => m.vocV },
  { header: "Isc A", numeric: true, cell: (m) => m.iscA },
  { header: "Vmp V", numeric: true, cell: (m) => m.vmpV },
  { header: "Imp A", numeric: true, cell: (m) => m.impA },
  { header: "γ Pmax %/°C", numeric: true, title: "Temperature coefficient of Pmax", cell: (m) => m.gammaPmaxPctPerC },
  { header: "β Voc", numeric: true, title: "Temperature coefficient of Voc, as on the datasheet", cell: (m) => `${m.vocCoeff.value} ${m.vocCoeff.unit}` },
  { header: "Fuse A", numeric: true, title: "Maximum series fuse rating", cell: (m) => m.maxSeriesFuseA ?? "—" },
  { header: "Size mm", numeric: true, cell: (m) => `${m.lengthMm}×${m.widthMm}` },
  {
    header: "Cells · build",
    cell: (m) => (
      <>
        {CELL_TECHNOLOGY_LABELS[m.cellTechnology]} · {CONSTRUCTION_LABELS[m.construction]}
        {m.encapsulant ? <span className="text-graphite-soft"> · {m.encapsulant}</span> : null}
      </>
    ),
  },
];

function inverterInputs(v: InverterView): string {
  if (v.kind === "string") {
    return `MPPT ${v.mpptMinV}–${v.mpptMaxV} V · max ${v.maxDcVoltageV} V DC · ${v.maxInputCurrentA} A × ${v.mpptCount} MPPT`;
  }
  return `DC ${v.dcInputMinV}–${v.dcInputMaxV} V · ${v.modulesPerUnit} module${v.modulesPerUnit === 1 ? "" : "s"} per unit`;
}

const INVERTER_COLUMNS: Column<InverterView>[] = [
  { header: "Kind", cell: (v) => INVERTER_KIND_LABELS[v.kind] },
  { header: "AC W", numeric: true, cell: (v) => v.acWatts },
  { header: "Eff. %", numeric: true, cell: (v) => v.efficiencyPct },
  { header: "DC input", className: "figure text-xs", cell: inverterInputs },
];

export function CatalogClient(props: { canManage: boolean; modules: ModuleView[]; inverters: InverterView[] }) {
  return (
    <div className="mt-6 space-y-10">
      <EquipmentSection
        canManage={props.canManage}
        rows={props.modules}
        heading="Modules"
        kind="modules"
        spec={MODULE_SPEC as unknown as EquipmentFormSpec<ModuleView>}
        columns={MODULE_COLUMNS}
        minWidth={960}
      />
      <EquipmentSection
        canManage={props.canManage}
        rows={props.inverters}
        heading="Inverters"
        kind="inverters"
        spec={INVERTER_SPEC as unknown as EquipmentFormSpec<InverterView>}
        columns={INVERTER_COLUMNS}
        minWidth={840}
      />
    </div>
  );
}
