import { NextResponse } from "next/server";
import { withRoute } from "@/lib/auth/api";
import { createSpare } from "@/lib/outlook/mutations";
import { spareSchema } from "@/lib/outlook/schemas";

export const dynamic = "force-dynamic";

// POST /api/spares – a stock line: a part of an engine profile on a ship or in the company store
export const POST = withRoute("POST /api/spares", async (req, { user }) => {
  const input = spareSchema.parse(await req.json().catch(() => ({})));
  const id = await createSpare({ id: user.id, name: user.name }, user, input);
  return NextResponse.json({ id, revision: 1 }, { status: 201 });
});
