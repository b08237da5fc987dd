import type { Metadata } from "next";
import { preload } from "react-dom";
import { NoAccess } from "@/components/no-access";
import { ElectricalDesignView } from "@/components/electrical-design-view";
import { singleLineDiagram } from "@/lib/single-line-diagram";
import { getDesignInputs } from "@/server/designs";
import { dealElectrical } from "@/server/electrical";
import { dealPageScope } from "../deal-page";
import { DesignClient } from "./design-client";
import { DesignMaterials } from "./design-materials";

export const metadata: Metadata = { title: "Design" };

export default async function DesignTab({ params }: { params: Promise<{ id: string }> }) {
  const scope = await dealPageScope(params);
  if (!scope) return null;
  if (!scope.rights.design) return <NoAccess section="Design" />;
  const id = scope.dealId;
  // Rendered with the page, so the editor does not wait for a second round trip (LCP).
  const inputs = JSON.parse(JSON.stringify(await getDesignInputs(scope))) as Awaited<ReturnType<typeof getDesignInputs>>;
  // The station's hourly weather starts downloading with the page's scripts, not after them.
  const saved = inputs.design?.document.weather;
  const stationId = saved?.kind === "station" ? saved.stationId : (inputs.nearest?.stationId ?? inputs.stations[0]?.id);
  if (stationId && saved?.kind !== "manual") preload(`/api/deals/${id}/design-inputs/weather?stationId=${stationId}`, { as: "fetch" });
  const faces = inputs.design?.document.faces.map((f) => ({ id: f.id, name: f.name })) ?? [];
  // The saved design, wired and checked (NEC edition from Settings → Company); a draft may fail.
  const electrical = await dealElectrical(scope, inputs.design?.document);
  const drawing = electrical ? singleLineDiagram(electrical, { householdName: scope.household.name, moduleLabel: moduleLabelOf(inputs, inputs.design?.document.moduleId), utilityName: scope.deal.utilityName ?? null }) : null;
  return (
    <div className="space-y-6">
      <DesignClient dealId={id} canEdit={scope.rights.edit} initialInputs={inputs} />
      {faces.length > 0 ? <DesignMaterials scope={scope} faces={faces} /> : null}
      {electrical && drawing ? <ElectricalDesignView design={electrical} drawing={drawing} headingId="electrical-heading" /> : null}
    </div>
  );
}

function moduleLabelOf(inputs: Awaited<ReturnType<typeof getDesignInputs>>, moduleId: string | undefined): string {
  const m = inputs.modules.find((x) => x.id === moduleId);
  return m ? `${m.manufacturer} ${m.model} ${m.stcWatts} W` : "modules";
}
