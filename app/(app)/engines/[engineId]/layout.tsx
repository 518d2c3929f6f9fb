import { requireRecordInScope } from "@/lib/auth/record-scope";

// Decides "no such engine on your vessels" before the page's loading skeleton starts the
// response, so the answer is an HTTP 404 rather than a not-found page sent with 200.
export default async function EngineLayout({ children, params }: { children: React.ReactNode; params: Promise<{ engineId: string }> }) {
  await requireRecordInScope("engine", (await params).engineId);
  return children;
}
