import { FieldError, Hint, Label } from "@/components/ui/field";
import { cn } from "@/lib/utils";

/** Label, control, hint and error for one field; `id` links them for screen readers. */
export function FormField({
  id,
  label,
  hint,
  error,
  className,
  children,
}: {
  id: string;
  label: React.ReactNode;
  hint?: React.ReactNode;
  error?: string[];
  className?: string;
  children: React.ReactNode;
}) {
  return (
    <div className={cn("min-w-0", className)}>
      <Label htmlFor={id}>{label}</Label>
      <div className="mt-1">{children}</div>
      {hint ? <Hint id={`${id}-hint`}>{hint}</Hint> : null}
      <FieldError id={`${id}-error`} messages={error} />
    </div>
  );
}
