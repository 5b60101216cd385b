/** Sondage's mark: a column of ledger lines with three selected points. */
export function Logo({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      <svg width="26" height="26" viewBox="0 0 26 26" aria-hidden>
        <rect x="1" y="1" width="24" height="24" rx="6" fill="#1b5132" />
        {[7, 11, 15, 19].map((y) => (
          <line key={y} x1="6" x2="20" y1={y} y2={y} stroke="#d5eadd" strokeOpacity="0.45" strokeWidth="1.2" />
        ))}
        <circle cx="9" cy="7" r="1.9" fill="#f8e6bd" />
        <circle cx="16" cy="15" r="1.9" fill="#f8e6bd" />
        <circle cx="12" cy="19" r="1.9" fill="#f8e6bd" />
      </svg>
      <span className="text-lg font-semibold tracking-tight text-ink">Sondage</span>
    </span>
  );
}
