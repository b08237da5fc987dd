// The schemas of the JSON columns that have no form schema of their own (src/db/schema.ts uses
// them with jsonColumn). The engine's figures and the proposal snapshot are written only by our
// code from typed values, so their check is the envelope (version and main parts), not each field.
import { z } from "zod";
import type { OfferFigures } from "../lib/offer-figures";
import { DEAL_TABLE_DEFAULT_SORT, savedViewQuerySchema } from "../lib/schemas/deal-table";
import type { ProposalSnapshot } from "../lib/schemas/proposal";

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

export const offerFiguresEnvelope = z.custom<OfferFigures>(
  (v) => isRecord(v) && v.version === 1 && isRecord(v.summary) && isRecord(v.price) && Array.isArray(v.rows),
  "Expected offer figures of version 1 (summary, price, rows)",
);

export const proposalSnapshotEnvelope = z.custom<ProposalSnapshot>(
  (v) => isRecord(v) && v.version === 1 && isRecord(v.household) && Array.isArray(v.offers),
  "Expected a proposal snapshot of version 1 (household, offers)",
);

/** A timeline event's details: any JSON object. */
export const timelineData = z.record(z.string(), z.unknown());

/** 8,760 (or 8,784) hourly values in kWh. */
export const hourlyKwh = z.array(z.number());

export const emailAddresses = z.array(z.string());

/** A saved view that no longer passes (say, a filter the table dropped) reads as the default sort. */
export const storedSavedViewQuery = savedViewQuerySchema.catch(() => savedViewQuerySchema.parse({ sort: DEAL_TABLE_DEFAULT_SORT }));

/** The stored usage year (deal_usage): twelve months and the months' estimated flags, 8760 hours, notes. */
export const monthlyKwh = z.array(z.number()).length(12);
export const monthFlags = z.array(z.boolean()).length(12);
export const notes = z.array(z.string());
