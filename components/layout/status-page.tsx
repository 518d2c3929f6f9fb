import Link from "next/link";
import { buttonClass } from "@/components/ui/button";

/** A quiet full-width message for "not found" and "went wrong", with a way back. */
export function StatusPage({
  code,
  title,
  children,
  action,
}: {
  code?: string;
  title: string;
  children: React.ReactNode;
  action?: React.ReactNode;
}) {
  return (
    <div className="mx-auto max-w-lg py-12 text-center">
      {code ? <p className="num text-sm font-semibold tracking-wide text-ink-faint uppercase">{code}</p> : null}
      <h1 className="mt-1 text-2xl font-semibold">{title}</h1>
      <div className="mt-3 text-ink-soft">{children}</div>
      <div className="mt-6 flex flex-wrap justify-center gap-3">
        {action}
        <Link href="/" className={buttonClass("secondary")}>
          Back to start
        </Link>
      </div>
    </div>
  );
}
