import type { NextRequest } from "next/server";
import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth";
import { env } from "@/lib/env";
import { throttleSignIn } from "@/lib/rate-limit";

const handler = NextAuth(authOptions);

type Ctx = { params: Promise<{ nextauth: string[] }> };

export function GET(req: NextRequest, ctx: Ctx) {
  return handler(req, ctx);
}

/** Credential sign-ins wait out the account's and the peer address's lockout before next-auth sees them. */
export async function POST(req: NextRequest, ctx: Ctx) {
  const { nextauth } = await ctx.params;
  if (nextauth[0] === "callback" && nextauth[1] === "credentials") {
    const form = await req
      .clone()
      .formData()
      .catch(() => null);
    const limited = throttleSignIn(req.headers, String(form?.get("email") ?? ""), env.NEXTAUTH_URL);
    if (limited) return limited;
  }
  return handler(req, ctx);
}
