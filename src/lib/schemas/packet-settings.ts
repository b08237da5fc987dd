// The company's job-packet settings, kept in company.settings under `packet` (a key Settings →
// Company's own form leaves alone): the fire-code edition the roof layout keeps pathways by, and
// the spares added to a bill of materials per kind of part.
import { z } from "zod";
import { FIRE_CODE_EDITIONS, FIRE_CODE_RULES, type FireCodeEdition } from "@/engine/roof-layout";
import { BOS_KINDS, BOS_KIND_LABELS } from "@/lib/schemas/bos";

export { FIRE_CODE_EDITIONS, type FireCodeEdition };
export const FIRE_CODE_LABELS: Record<FireCodeEdition, string> = Object.fromEntries(FIRE_CODE_EDITIONS.map((e) => [e, FIRE_CODE_RULES[e].label])) as Record<FireCodeEdition, string>;

/** Spares for one kind: a percentage of the needed quantity (rounded up) or a fixed count. */
export const spareSchema = z.discriminatedUnion("mode", [
  z.object({ mode: z.literal("percent"), percent: z.number({ error: "Enter a percentage" }).min(0, "Spares must be 0 % or more").max(50, "Spares must be at most 50 %") }),
  z.object({ mode: z.literal("count"), count: z.number({ error: "Enter a count" }).int("Spares must be a whole number").min(0, "Spares must be 0 or more").max(100, "Spares must be at most 100") }),
]);
export type Spare = z.output<typeof spareSchema>;
export const SPARE_KINDS = BOS_KINDS.filter((k) => k !== "label");
export const SPARE_KIND_LABELS = BOS_KIND_LABELS;

export const packetSettingsSchema = z.object({
  fireCodeEdition: z.enum(FIRE_CODE_EDITIONS, { error: `Edition must be one of: ${FIRE_CODE_EDITIONS.join(", ")}` }),
  spares: z.partialRecord(z.enum(BOS_KINDS), spareSchema),
});
export type PacketSettings = z.output<typeof packetSettingsSchema>;

/** Until a company chooses: the newest edition listed, and a few spare clamps and attachments (our choice: small parts get lost on a roof). */
export const DEFAULT_PACKET_SETTINGS: PacketSettings = {
  fireCodeEdition: "2021",
  spares: { mid_clamp: { mode: "percent", percent: 5 }, end_clamp: { mode: "percent", percent: 5 }, attachment: { mode: "percent", percent: 5 }, splice: { mode: "count", count: 1 } },
};

/** The stored settings read forgivingly: anything missing or damaged falls back to the default. */
export function packetSettingsOf(settings: unknown): PacketSettings {
  const raw = settings && typeof settings === "object" ? (settings as Record<string, unknown>).packet : undefined;
  const parsed = packetSettingsSchema.safeParse(raw);
  return parsed.success ? parsed.data : DEFAULT_PACKET_SETTINGS;
}

/** The spares as the engine takes them. */
export const enginesSpares = (s: PacketSettings) =>
  Object.fromEntries(Object.entries(s.spares).map(([k, v]) => [k, v.mode === "percent" ? { percent: v.percent } : { count: v.count }]));
