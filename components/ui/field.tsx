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

export const selectClass =
  "block w-full min-h-11 rounded-md border border-ink-line bg-paper-raised px-3 text-base text-ink focus:border-signal aria-[invalid=true]:border-limit";

export function Select({ className, ...props }: React.SelectHTMLAttributes<HTMLSelectElement>) {
  return <select className={cn(selectClass, className)} {...props} />;
}

export function Textarea({ className, ...props }: React.TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <textarea className={cn(inputClass, "min-h-20 py-2", className)} {...props} />;
}

export function Hint({ id, children }: { id?: string; children: React.ReactNode }) {
  return (
    <p id={id} className="mt-1 text-xs text-ink-faint">
      {children}
    </p>
  );
}

/**
 * Enter in a one-line field moves to the next field of the form instead of submitting it
 * (a half-filled header sent by a reflex Enter is a draft with gaps). Put on the <form> as
 * onKeyDown; the submit button, text areas and selects keep their own Enter.
 */
export function enterMovesToNextField(e: React.KeyboardEvent<HTMLFormElement>) {
  const el = e.target as HTMLElement;
  if (e.key !== "Enter" || e.shiftKey || e.altKey || e.ctrlKey || e.metaKey || e.nativeEvent.isComposing) return;
  if (!(el instanceof HTMLInputElement) || ["submit", "button", "checkbox", "radio", "file", "reset"].includes(el.type)) return;
  e.preventDefault();
  const fields = [...e.currentTarget.querySelectorAll<HTMLElement>("input, select, textarea, button")].filter(
    (f) => !(f as HTMLInputElement).disabled && f.tabIndex >= 0 && (f as HTMLInputElement).type !== "hidden" && f.offsetParent !== null,
  );
  const next = fields[fields.indexOf(el) + 1];
  next?.focus();
}
