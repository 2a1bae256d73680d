import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";
import { guardedRoute } from "@/lib/http/api-guard";

// next-auth's form posts keep its own CSRF token; the guard adds the origin check (lib/http/request-guard.ts).
const nextAuthHandler = guardedRoute(NextAuth(authOptions) as (req: Request, ctx: RouteContext<"/api/auth/[...nextauth]">) => Promise<Response>);
export { nextAuthHandler as GET, nextAuthHandler as POST };
