/** A page of the notebook: a white sheet with a hairline edge. */
export function Sheet({ className = "", ...props }: React.HTMLAttributes<HTMLElement>) {
  return <section className={`rounded-lg border border-rule bg-sheet p-4 sm:p-6 ${className}`} {...props} />;
}

export function SectionTitle({ children, action }: { children: React.ReactNode; action?: React.ReactNode }) {
  return (
    <div className="mb-3 flex items-end justify-between gap-3 border-b border-rule pb-2">
      <h2 className="text-xl">{children}</h2>
      {action}
    </div>
  );
}

/** What to do next when a list is empty. */
export function EmptyState({ title, children }: { title: string; children?: React.ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-rule-strong bg-sheet/60 p-6 text-center">
      <p className="font-serif text-lg">{title}</p>
      {children && <div className="mt-2 text-ink-soft">{children}</div>}
    </div>
  );
}

type Tone = "info" | "caution" | "danger" | "ok";
const tones: Record<Tone, string> = {
  info: "border-accent/30 bg-accent-soft text-ink",
  caution: "border-caution/30 bg-caution-soft text-ink",
  danger: "border-danger/30 bg-danger-soft text-danger",
  ok: "border-ok/30 bg-ok-soft text-ink",
};

export function Notice({ tone = "info", children, className = "" }: { tone?: Tone; children: React.ReactNode; className?: string }) {
  return (
    <div role={tone === "danger" ? "alert" : "status"} className={`rounded-md border px-3 py-2 text-sm ${tones[tone]} ${className}`}>
      {children}
    </div>
  );
}
