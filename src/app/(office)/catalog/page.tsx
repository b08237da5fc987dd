import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { listActiveInverters, listActiveModules, listInverters, listModules, type InverterModel, type ModuleModel } from "@/server/catalog";
import { listBosParts, type BosPart } from "@/server/bos-catalog";
import { getMember } from "@/server/session";
import { BosSection, type BosPartView } from "./bos-section";
import { CatalogClient, type InverterView, type ModuleView } from "./catalog-client";

export const metadata: Metadata = { title: "Catalog" };

const moduleView = ({ companyId, createdAt, updatedAt, ...rest }: ModuleModel): ModuleView => (void [companyId, createdAt, updatedAt], rest);
const bosView = ({ id, kind, manufacturer, model, details, priceLineItemId, active }: BosPart): BosPartView => ({ id, kind, manufacturer, model, details, priceLineItemId, active });
const inverterView = ({ companyId, createdAt, updatedAt, ...rest }: InverterModel): InverterView => (void [companyId, createdAt, updatedAt], rest);

/** Catalog: the company's modules and inverters. Admins keep it; reps see what designs may use. */
export default async function CatalogPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "catalog:read")) return <NoAccess section="Catalog" />;
  const canManage = can(member.role, "catalog:manage");
  // Admins see deactivated equipment too (to reactivate it); everyone else only what new designs may use.
  const [modules, inverters] = canManage
    ? await Promise.all([listModules(member.companyId), listInverters(member.companyId)])
    : await Promise.all([listActiveModules(member.companyId), listActiveInverters(member.companyId)]);
  const parts = await listBosParts(member.companyId, !canManage);
  return (
    <>
      <h1 className="text-2xl font-semibold">Catalog</h1>
      <p className="mt-1 text-graphite-soft">
        {canManage
          ? `The modules and inverters ${member.companyName} designs with. Deactivated equipment stays on existing designs but cannot be picked for new ones.`
          : `The modules and inverters you can pick for a design. Ask an admin to add or change equipment.`}
      </p>
      <CatalogClient canManage={canManage} modules={modules.map(moduleView)} inverters={inverters.map(inverterView)} />
      <div className="mt-10">
        <BosSection canManage={canManage} rows={parts.map(bosView)} />
      </div>
    </>
  );
}
