import { importEquipment } from "@/server/catalog-routes";

export const POST = importEquipment("bos-parts");
