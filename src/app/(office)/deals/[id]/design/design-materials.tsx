import { MaterialsSections } from "@/components/ui/materials-view";
import type { DealScope } from "@/server/deal-scope";
import { designMaterials } from "@/server/job-materials";
import { getRoofSurvey } from "@/server/roof-survey";
import { RoofSurveyForm } from "./roof-survey-form";

/** Under the design: the roof survey, then the layout and bill of materials the job packet will carry. */
export async function DesignMaterials({ scope, faces }: { scope: DealScope; faces: { id: string; name: string }[] }) {
  const [survey, materials] = await Promise.all([getRoofSurvey(scope.member.companyId, scope.dealId), designMaterials(scope)]);
  const { id: _id, dealId: _deal, ...saved } = survey;
  return (
    <div className="mt-6 space-y-4" data-testid="design-materials">
      <RoofSurveyForm dealId={scope.dealId} faces={faces} saved={saved} canEdit={scope.rights.edit} />
      {materials ? <MaterialsSections materials={materials} idPrefix="design" /> : null}
    </div>
  );
}
