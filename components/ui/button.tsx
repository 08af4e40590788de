import Link from "next/link";

type Variant = "primary" | "plain" | "danger" | "quiet";

const styles: Record<Variant, string> = {
  primary: "bg-accent text-accent-ink hover:brightness-110 border border-accent",
  plain: "bg-sheet text-ink border border-rule-strong hover:bg-paper",
  danger: "bg-sheet text-danger border border-danger/40 hover:bg-danger-soft",
  quiet: "bg-transparent text-accent border border-transparent hover:bg-accent-soft",
};

/** Buttons are at least 44 px tall: they are pressed with gloved, wet fingers. */
export function buttonClass(variant: Variant = "primary", extra = ""): string {
  return `inline-flex min-h-11 items-center justify-center gap-2 rounded-md px-4 py-2 text-base font-medium transition disabled:opacity-50 disabled:cursor-not-allowed ${styles[variant]} ${extra}`;
}

export function Button({
  variant = "primary",
  className = "",
  ...props
}: React.ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button type="button" className={buttonClass(variant, className)} {...props} />;
}

export function ButtonLink({
  variant = "primary",
  className = "",
  ...props
}: React.ComponentProps<typeof Link> & { variant?: Variant }) {
  return <Link className={buttonClass(variant, className)} {...props} />;
}
