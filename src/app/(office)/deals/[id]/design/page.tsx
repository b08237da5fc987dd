import type { Metadata } from "next";
import { preload } from "react-dom";
import { NoAccess } from "@/components/no-access";
import { getDesignInputs } from "@/server/designs";
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
  return (
    <>
      <DesignClient dealId={id} canEdit={scope.rights.edit} initialInputs={inputs} />
      {faces.length > 0 ? <DesignMaterials scope={scope} faces={faces} /> : null}
    </>
  );
}
