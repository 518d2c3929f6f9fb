import { NextResponse } from "next/server";
import { parseId, withRoute } from "@/lib/auth/api";
import { updateSpare } from "@/lib/outlook/mutations";
import { spareUpdateSchema } from "@/lib/outlook/schemas";

export const dynamic = "force-dynamic";

// PUT /api/spares/:spareId – change a stock line's counts, lead time or costs (at the revision seen)
export const PUT = withRoute<{ spareId: string }>("PUT /api/spares/[spareId]", async (req, { user, params }) => {
  const input = spareUpdateSchema.parse(await req.json().catch(() => ({})));
  return NextResponse.json(await updateSpare({ id: user.id, name: user.name }, user, parseId(params.spareId, "Stock line"), input));
});
