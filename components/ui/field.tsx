import { cn } from "@/lib/utils";

export function Label({ className, ...props }: React.LabelHTMLAttributes<HTMLLabelElement>) {
  return <label className={cn("block text-sm font-medium text-ink-soft", className)} {...props} />;
}

export const inputClass =
  "block w-full min-h-11 rounded-md border border-ink-line bg-paper-raised px-3 text-base text-ink placeholder:text-ink-faint focus:border-signal aria-[invalid=true]:border-limit";

export function Input({ className, ...props }: React.InputHTMLAttributes<HTMLInputElement>) {
  return <input className={cn(inputClass, className)} {...props} />;
}

export function FieldError({ id, messages }: { id?: string; messages?: string[] }) {
  if (!messages?.length) return null;
  return (
    <p id={id} className="mt-1 text-sm font-medium text-limit" role="alert">
      <span aria-hidden="true">⚠ </span>
      {messages.join(" ")}
    </p>
  );
}
