import { NextResponse } from "next/server";
import { stageMoveSchema } from "@/lib/stage-rules";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";
import { moveDealStage, StageRuleError } from "@/server/stages";

/** Moves a deal by hand: { stage, reason? }. A refused move answers 422 with code "stage_rule". */
export const PATCH = withMember<{ id: string }>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const input = await readJson(req, stageMoveSchema);
  try {
    return NextResponse.json({ data: await moveDealStage(member, params.id, input.stage, input.reason) });
  } catch (err) {
    if (err instanceof StageRuleError) {
      return NextResponse.json(
        { error: { code: err.code, message: err.message, ...(err.needs ? { needs: err.needs, fields: err.fields } : {}) } },
        { status: 422 },
      );
    }
    throw err;
  }
});
