/** The white card every signed-out page sits in. */
export function AuthCard({ title, lead, children }: { title: string; lead?: React.ReactNode; children?: React.ReactNode }) {
  return (
    <div className="w-full max-w-md rounded-xl bg-paper p-6 text-ink shadow-2xl sm:p-8">
      <h1 className="text-2xl font-semibold">{title}</h1>
      {lead ? <div className="mt-2 text-sm text-ink-soft">{lead}</div> : null}
      {children}
    </div>
  );
}
