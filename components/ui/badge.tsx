type Tone = "neutral" | "green" | "amber" | "red" | "blue";

const tones: Record<Tone, string> = {
  neutral: "bg-paper-sunk text-ink-soft",
  green: "bg-ledger-50 text-ledger-700 ring-ledger-100",
  amber: "bg-amber-50 text-amber-700 ring-amber-100",
  red: "bg-brick-50 text-brick-700 ring-brick-100",
  blue: "bg-slate-50 text-slate-700 ring-slate-100",
};

export function Badge({ tone = "neutral", children }: { tone?: Tone; children: React.ReactNode }) {
  return (
    <span
      className={`inline-flex items-center whitespace-nowrap rounded-full px-2 py-0.5 text-xs font-medium ring-1 ring-inset ring-transparent ${tones[tone]}`}
    >
      {children}
    </span>
  );
}
