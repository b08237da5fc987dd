import { readById } from "@/server/route";
import { getUploadMetadataOrThrow } from "@/server/weather-stations";

/** One upload's metadata (name, type, size, SHA-256), never its bytes; other companies' uploads are not found. */
export const GET = readById("deals:read-own", "Upload", getUploadMetadataOrThrow);
