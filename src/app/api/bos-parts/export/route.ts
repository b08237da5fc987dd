import { exportEquipment } from "@/server/catalog-routes";

export const GET = exportEquipment("bos-parts");
