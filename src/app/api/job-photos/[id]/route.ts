import { getJobPhotoOrThrow } from "@/server/jobs";
import { readById } from "@/server/route";

/** One job photo's metadata (the image itself: ./file). */
export const GET = readById("jobs:read", "Photo", getJobPhotoOrThrow);
