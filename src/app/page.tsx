import { redirect } from "next/navigation";
import { getMember } from "@/server/session";

export default async function Home() {
  redirect((await getMember()) ? "/today" : "/sign-in");
}
