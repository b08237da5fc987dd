import { addEquipment, listEquipment } from "@/server/catalog-routes";

export const GET = listEquipment("inverters");
export const POST = addEquipment("inverters");
