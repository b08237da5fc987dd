import { deleteById, readById } from "@/server/route";
import { deleteStation, getStationOrThrow } from "@/server/weather-stations";

export const GET = readById("weather:read", "Weather station", (member, id) => getStationOrThrow(member.companyId, id));

/** Removes a station and its file; 409 while a design uses it. */
export const DELETE = deleteById("weather:manage", "Weather station", deleteStation);
