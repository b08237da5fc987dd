import { readById } from "@/server/route";
import { getRoofSurveyOrThrow } from "@/server/roof-survey";

export const GET = readById("deals:read-own", "Roof survey", getRoofSurveyOrThrow);
