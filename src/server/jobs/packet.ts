import "server-only";
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { company, deal, design, household, proposal, upload, utility } from "@/db/schema";
import { checkStringPlan, inverterAcKw, STRING_CAUTION } from "@/lib/offer-figures";
import { ELECTRICAL_CAUTION } from "@/lib/electrical-design";
import type { DesignDocument } from "@/lib/schemas/design";
import type { ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import { getInverterOrThrow, getModuleOrThrow, type InverterModel, type ModuleModel } from "@/server/catalog";
import { householdAddress } from "@/server/records";
import { db } from "@/server/db";
import { HttpError, notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import { storage } from "@/server/storage";
import type { JobPacket, JobRecord, PacketFace } from "@/lib/job-packet";
import { packetMaterials } from "@/server/job-materials";
import { listJobPhotos } from "./crew-work";
import { packetElectrical } from "./packet-electrical";
import type { ElectricalDesign } from "@/engine/electrical/design";
import { getJobOrThrow, getJobRowOrThrow } from "./read";

// ── The job packet (web and PDF) ─────────────────────────────────────────────────────────

async function signedOffer(companyId: string, j: JobRecord): Promise<{ offer: ProposalSnapshotOffer; label: string } | null> {
  const rows = await db()
    .select({ id: proposal.id, number: proposal.number, version: proposal.version, status: proposal.status, snapshot: proposal.snapshot, chosenPosition: proposal.chosenPosition })
    .from(proposal)
    .where(and(eq(proposal.companyId, companyId), eq(proposal.dealId, j.dealId), inArray(proposal.status, ["signed"])))
    .orderBy(desc(proposal.signedAt));
  const chosen = rows.find((r) => r.id === j.proposalId) ?? rows[0];
  if (!chosen || chosen.chosenPosition == null) return null;
  const offer = chosen.snapshot.offers.find((o) => o.position === chosen.chosenPosition);
  return offer ? { offer, label: `Signed proposal ${chosen.number} v${chosen.version}, offer “${offer.name}”` } : null;
}

async function designOf(companyId: string, dealId: string): Promise<DesignDocument | null> {
  const [row] = await db()
    .select({ document: design.document })
    .from(design)
    .where(and(eq(design.companyId, companyId), eq(design.dealId, dealId)))
    .limit(1);
  return row?.document ?? null;
}

async function catalogPair(companyId: string, moduleId: string | null | undefined, inverterId: string | null | undefined): Promise<{ mod: ModuleModel | null; inv: InverterModel | null }> {
  const mod = moduleId ? await getModuleOrThrow(companyId, moduleId).catch(() => null) : null;
  const inv = inverterId ? await getInverterOrThrow(companyId, inverterId).catch(() => null) : null;
  return { mod, inv };
}

function inverterUnits(inv: { kind: "string" | "micro"; modulesPerUnit?: number | null }, moduleCount: number, stringInverters: number): number {
  return inv.kind === "micro" ? Math.ceil(moduleCount / Math.max(1, inv.modulesPerUnit ?? 1)) : stringInverters;
}

/** The household and deal fields the packet shows (the deal's own company only). */
async function siteOf(companyId: string, dealId: string) {
  const [h] = await db()
    .select({
      name: household.name,
      contactName: household.contactName,
      phone: household.phone,
      email: household.email,
      secondContactName: household.secondContactName,
      secondContactPhone: household.secondContactPhone,
      ...householdAddress,
      utilityName: utility.name,
    })
    .from(deal)
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(utility, and(eq(utility.id, deal.utilityId), eq(utility.companyId, deal.companyId)))
    .where(and(eq(deal.id, dealId), eq(deal.companyId, companyId)))
    .limit(1);
  return h ?? null;
}

type PacketEquipment = Pick<JobPacket, "source" | "faces" | "bom" | "system">;

/** What goes on the roof: the signed proposal's chosen offer first, else the deal's design. */
function equipmentOf(
  signed: { offer: ProposalSnapshotOffer; label: string } | null,
  doc: DesignDocument | null,
  mod: ModuleModel | null,
  inv: InverterModel | null,
  stringInverters: number,
): PacketEquipment {
  if (signed) {
    const eqp = signed.offer.equipment;
    const units = inverterUnits({ kind: eqp.inverter.kind, modulesPerUnit: inv?.modulesPerUnit }, eqp.moduleCount, stringInverters);
    return {
      source: { kind: "proposal", label: signed.label },
      faces: eqp.faces.filter((f) => f.moduleCount > 0).map((f) => ({ name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, moduleCount: f.moduleCount })),
      bom: [
        { item: "PV module", detail: `${eqp.module.manufacturer} ${eqp.module.model}, ${eqp.module.stcWatts} W STC`, quantity: eqp.moduleCount, unit: "pcs" },
        {
          item: eqp.inverter.kind === "micro" ? "Microinverter" : "String inverter",
          detail: `${eqp.inverter.manufacturer} ${eqp.inverter.model}, ${eqp.inverter.acWatts} W AC`,
          quantity: units,
          unit: "pcs",
        },
      ],
      system: {
        moduleCount: eqp.moduleCount,
        kwDc: (eqp.moduleCount * eqp.module.stcWatts) / 1000,
        kwAc: (units * eqp.inverter.acWatts) / 1000,
      },
    };
  }
  if (doc && mod && inv) {
    const faces: PacketFace[] = doc.faces.filter((f) => f.moduleCount > 0).map((f) => ({ name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, moduleCount: f.moduleCount }));
    const moduleCount = faces.reduce((s, f) => s + f.moduleCount, 0);
    const units = inverterUnits(inv, moduleCount, stringInverters);
    return {
      source: { kind: "design", label: "The deal's design (no signed proposal on record)" },
      faces,
      bom: [
        { item: "PV module", detail: `${mod.manufacturer} ${mod.model}, ${mod.stcWatts} W STC`, quantity: moduleCount, unit: "pcs" },
        { item: inv.kind === "micro" ? "Microinverter" : "String inverter", detail: `${inv.manufacturer} ${inv.model}, ${inv.acWatts} W AC`, quantity: units, unit: "pcs" },
      ],
      system: { moduleCount, kwDc: (moduleCount * mod.stcWatts) / 1000, kwAc: inverterAcKw(inv, stringInverters, moduleCount) },
    };
  }
  return { source: { kind: "none", label: "No signed proposal or design yet" }, faces: [], bom: [], system: null };
}

/** The design's string plan checked against the module and string inverter (string inverters only). */
function stringPlanOf(doc: DesignDocument | null, mod: ModuleModel | null, inv: InverterModel | null, stringInverters: number, system: JobPacket["system"]): JobPacket["stringPlan"] {
  if (!doc?.stringPlan || !mod || !inv || inv.kind !== "string") return null;
  const check = checkStringPlan(mod, inv, stringInverters, doc.stringPlan);
  const notes: string[] = [];
  const planned = doc.stringPlan.stringSizes.reduce((s, n) => s + n, 0);
  if (system && planned !== system.moduleCount) notes.push(`The strings hold ${planned} modules; the system has ${system.moduleCount}. Ask the office before wiring.`);
  return { lowestTempC: doc.stringPlan.lowestTempC, highestTempC: doc.stringPlan.highestTempC, stringSizes: doc.stringPlan.stringSizes, check, notes };
}

/** Layout and bill of materials for what goes on the roof (the signed offer's faces, matched to the design's by name, else the design's). */
async function materialsOf(
  companyId: string,
  dealId: string,
  src: { signed: { offer: ProposalSnapshotOffer } | null; doc: DesignDocument | null; mod: ModuleModel | null; inv: InverterModel | null; stringInverters: number; electrical: ElectricalDesign | null },
): Promise<JobPacket["materials"]> {
  const { signed, doc, mod, inv } = src;
  if (!mod || !inv || (!signed && !doc)) return null;
  const idOf = (name: string) => doc?.faces.find((f) => f.name === name)?.id ?? null;
  const faces = signed
    ? signed.offer.equipment.faces.map((f) => ({ id: idOf(f.name), name: f.name, tiltDeg: f.tiltDeg, moduleCount: f.moduleCount }))
    : (doc?.faces ?? []).map((f) => ({ id: f.id, name: f.name, tiltDeg: f.tiltDeg, moduleCount: f.moduleCount }));
  const moduleCount = faces.reduce((s, f) => s + f.moduleCount, 0);
  return packetMaterials({ companyId, dealId, faces, mod, inv, inverterUnits: inverterUnits(inv, moduleCount, src.stringInverters), stringSizes: doc?.stringPlan?.stringSizes ?? null, electrical: src.electrical });
}

/** Everything the crew needs on site, for one job they may see. */
export async function getJobPacket(member: Member, jobId: string): Promise<JobPacket> {
  const j = await getJobOrThrow(member, jobId);
  const h = await siteOf(member.companyId, j.dealId);
  if (!h) throw notFound("Job");
  const [co] = await db()
    .select({ name: company.name, licenseNumber: company.licenseNumber })
    .from(company)
    .where(eq(company.id, member.companyId))
    .limit(1);

  const signed = await signedOffer(member.companyId, j);
  const doc = await designOf(member.companyId, j.dealId);
  const moduleId = signed?.offer.inputs.moduleId ?? doc?.moduleId ?? null;
  const inverterId = signed?.offer.inputs.inverterId ?? doc?.inverterId ?? null;
  const { mod, inv } = await catalogPair(member.companyId, moduleId, inverterId);
  const stringInverters = doc?.inverterCount ?? 1;
  const { source, faces, bom, system } = equipmentOf(signed, doc, mod, inv, stringInverters);
  const stringPlan = stringPlanOf(doc, mod, inv, stringInverters, system);
  const electrical = await packetElectrical(member.companyId, { dealId: j.dealId, doc, moduleId, inverterId, moduleCount: system?.moduleCount ?? 0, householdName: h.name, utilityName: h.utilityName, moduleLabel: mod ? `${mod.manufacturer} ${mod.model} ${mod.stcWatts} W` : "modules" });
  const materials = await materialsOf(member.companyId, j.dealId, { signed, doc, mod, inv, stringInverters, electrical: electrical?.design ?? null });

  const sitePhotos = await db()
    .select({ id: upload.id, fileName: upload.fileName, mimeType: upload.mimeType })
    .from(upload)
    .where(and(eq(upload.companyId, member.companyId), eq(upload.dealId, j.dealId), eq(upload.purpose, "site_photo")))
    .orderBy(asc(upload.createdAt));
  const photos = await listJobPhotos(member, jobId);

  return {
    job: j,
    company: { name: co?.name ?? member.companyName, licenseNumber: co?.licenseNumber ?? null },
    customer: {
      name: h.name,
      contactName: h.contactName,
      phone: h.phone,
      email: h.email,
      secondContactName: h.secondContactName,
      secondContactPhone: h.secondContactPhone,
    },
    site: {
      street: h.street,
      city: h.city,
      region: h.region,
      postalCode: h.postalCode,
      latitude: h.latitude,
      longitude: h.longitude,
      // RFC 5870 geo: URI with the address as the query, so a phone's map app can open it.
      mapUri: `geo:${h.latitude},${h.longitude}?q=${encodeURIComponent(`${h.street}, ${h.city}, ${h.region} ${h.postalCode}`)}`,
      utilityName: h.utilityName,
    },
    source,
    faces,
    system,
    bom,
    materials,
    stringPlan,
    electrical,
    cautions: [STRING_CAUTION, ELECTRICAL_CAUTION, "Roof attachments, structural loads and conductor sizing follow the stamped plan set and the AHJ's requirements."],
    sitePhotos,
    photos,
    crewName: j.crewName,
  };
}

/** A rep's site photo of the job's deal (bytes), for the crew's packet. */
export async function getJobSitePhotoFile(member: Member, jobId: string, uploadId: string): Promise<{ bytes: Uint8Array; mimeType: string }> {
  const j = await getJobRowOrThrow(member, jobId);
  const [row] = await db()
    .select({ storageKey: upload.storageKey, mimeType: upload.mimeType })
    .from(upload)
    .where(and(eq(upload.id, uploadId), eq(upload.companyId, member.companyId), eq(upload.dealId, j.dealId), eq(upload.purpose, "site_photo")))
    .limit(1);
  if (!row) throw notFound("Site photo");
  const bytes = await storage().get(row.storageKey);
  if (!bytes) throw new HttpError(404, "not_found", "The site photo's file is missing from storage.");
  return { bytes, mimeType: row.mimeType };
}
