import { requireRecordInScope } from "@/lib/auth/record-scope";

// Decides "no such unit on your vessels" before the page's loading skeleton starts the
// response, so the answer is an HTTP 404 rather than a not-found page sent with 200.
export default async function UnitLayout({ children, params }: { children: React.ReactNode; params: Promise<{ unitId: string }> }) {
  await requireRecordInScope("unit", (await params).unitId);
  return children;
}
