export function PageHeader({
  eyebrow,
  title,
  children,
  actions,
}: {
  eyebrow?: string;
  title: string;
  children?: React.ReactNode;
  actions?: React.ReactNode;
}) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-ink-line pb-5">
      <div>
        {eyebrow && <p className="text-xs font-semibold uppercase tracking-[0.14em] text-ledger-600">{eyebrow}</p>}
        <h1 className="mt-1 text-2xl font-semibold">{title}</h1>
        {children && <div className="mt-1 text-sm text-ink-soft">{children}</div>}
      </div>
      {actions && <div className="flex gap-2">{actions}</div>}
    </div>
  );
}
