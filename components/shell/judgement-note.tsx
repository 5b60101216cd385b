/** The caution every screen carries: Sondage supports the auditor's judgement; it does not replace it. */
export function JudgementNote({ className = "" }: { className?: string }) {
  return (
    <p className={`text-xs leading-relaxed text-ink-faint ${className}`}>
      Sondage&rsquo;s selections and evaluations support, and do not replace, the auditor&rsquo;s professional
      judgement, the applicable standards (AU-C 530, ISA 530, AS 2315) and your firm&rsquo;s methodology.
    </p>
  );
}
