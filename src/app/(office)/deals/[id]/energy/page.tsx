import type { Metadata } from "next";
import { getDealUsage, listBills, listDealUploads } from "@/server/energy";
import { dealPageScope } from "../deal-page";
import { EnergyClient } from "./energy-client";

export const metadata: Metadata = { title: "Energy" };

export default async function EnergyTab({ params }: { params: Promise<{ id: string }> }) {
  const scope = await dealPageScope(params);
  if (!scope) return null;
  const id = scope.dealId;
  const [bills, usage, uploads] = await Promise.all([listBills(scope), getDealUsage(scope), listDealUploads(scope)]);
  return (
    <EnergyClient
      dealId={id}
      canEdit={scope.rights.edit}
      initialBills={bills.map(({ periodStart, periodEnd, kwh, costCents, uploadId, source, periodEstimated }) => ({ periodStart, periodEnd, kwh, costCents, uploadId, source, periodEstimated }))}
      initialUsage={{ monthlyKwh: usage.monthlyKwh, annualKwh: usage.annualKwh, source: usage.source, estimatedMonths: usage.estimatedMonths, warnings: usage.warnings, averageCentsPerKwh: usage.averageCentsPerKwh, fillMethod: usage.fillMethod }}
      uploads={uploads.map((u) => ({ id: u.id, fileName: u.fileName, mimeType: u.mimeType, purpose: u.purpose, createdAt: u.createdAt.toISOString() }))}
    />
  );
}
