import { jobFieldsSchema } from "@/lib/schemas/jobs";
import { getJobOrThrow, updateJob } from "@/server/jobs";
import { readById, writeById } from "@/server/route";

/** One job (another company's, or another crew's for an installer: 404). */
export const GET = readById("jobs:read", "Job", getJobOrThrow);

/** The office sets dates, crew, permit and interconnection records, notes; dates move the deal. */
export const PATCH = writeById("jobs:manage", "Job", jobFieldsSchema, updateJob);
