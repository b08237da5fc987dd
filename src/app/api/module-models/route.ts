import { addEquipment, listEquipment } from "@/server/catalog-routes";

export const GET = listEquipment("modules");
export const POST = addEquipment("modules");
