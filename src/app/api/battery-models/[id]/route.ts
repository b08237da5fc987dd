import { batteryPatchSchema } from "@/lib/schemas/battery-catalog";
import { getBatteryOrThrow, patchBattery } from "@/server/battery-catalog";
import { deleteById, readById, writeById } from "@/server/route";

export const GET = readById("catalog:read", "Battery", (member, id) => getBatteryOrThrow(member.companyId, id));

/** Changes some fields (the result is checked as a whole) and/or `active`. */
export const PATCH = writeById("catalog:manage", "Battery", batteryPatchSchema, patchBattery);

/** Equipment is never deleted (offers keep their datasheets): DELETE deactivates. */
export const DELETE = deleteById("catalog:manage", "Battery", (member, id) => patchBattery(member, id, { active: false }));
