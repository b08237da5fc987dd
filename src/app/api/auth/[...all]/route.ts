import { auth } from "@/server/auth";

const handle = (req: Request) => auth().handler(req);
export { handle as GET, handle as POST };
