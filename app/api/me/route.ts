import { requireUser } from "@/lib/auth/require-user";
import { handler } from "@/lib/http/route";

export const GET = handler(async () => {
  const user = await requireUser();
  return Response.json({ user });
});
