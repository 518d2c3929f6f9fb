import { cn } from "@/lib/utils";

type Variant = "primary" | "secondary" | "quiet" | "danger";

const variants: Record<Variant, string> = {
  primary: "bg-signal text-white hover:bg-signal-strong border-signal",
  secondary: "bg-paper-raised text-ink border-ink-line hover:border-ink-soft",
  quiet: "bg-transparent text-signal border-transparent hover:bg-signal-tint",
  danger: "bg-paper-raised text-limit border-limit hover:bg-limit-tint",
};

/** Actions have no place on paper: every button, and every link styled as one, is left out of print. */
export function buttonClass(variant: Variant = "primary", size: "md" | "lg" = "md"): string {
  return cn(
    "inline-flex items-center justify-center gap-2 rounded-md border font-medium transition-colors",
    "disabled:cursor-not-allowed disabled:opacity-50 print:hidden",
    size === "lg" ? "min-h-12 px-5 text-base" : "min-h-11 min-w-11 px-4 text-sm",
    variants[variant],
  );
}

export function Button({
  variant = "primary",
  size = "md",
  className,
  ...props
}: React.ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; size?: "md" | "lg" }) {
  return <button className={cn(buttonClass(variant, size), className)} {...props} />;
}
