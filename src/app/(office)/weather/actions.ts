"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { memberAction } from "@/server/action";
import { deleteStation } from "@/server/weather-stations";

export const deleteStationAction = memberAction("weather:manage", z.object({ stationId: z.uuid() }), async ({ stationId }, member) => {
  const result = await deleteStation(member, stationId);
  revalidatePath("/weather");
  return result;
});
