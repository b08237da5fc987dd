import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { getDealOrThrow } from "@/server/deals";
import { getMember } from "@/server/session";
import { DesignClient } from "./design-client";

export const metadata: Metadata = { title: "Design" };

export default async function DesignTab({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "catalog:read") || !can(member.role, "weather:read")) return <NoAccess section="Design" />;
  await getDealOrThrow(member, id);
  return <DesignClient dealId={id} canEdit={can(member.role, "deals:write")} />;
}
