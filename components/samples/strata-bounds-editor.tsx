"use client";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { formatMoney } from "@/lib/format/number";

interface Props {
  value: string[];
  onChange: (bounds: string[]) => void;
  error?: string;
  currency: string;
}

/** Upper boundaries of the book-value bands, ascending; the last band is open above. */
export function StrataBoundsEditor({ value, onChange, error, currency }: Props) {
  const set = (i: number, v: string) => onChange(value.map((b, j) => (j === i ? v : b)));
  const remove = (i: number) => onChange(value.filter((_, j) => j !== i));
  const add = () => {
    const last = Number(value.at(-1) ?? 0);
    onChange([...value, Number.isFinite(last) && last > 0 ? (last * 4).toFixed(2) : ""]);
  };
  return (
    <fieldset className="space-y-2" aria-describedby={error ? "strata-bounds-error" : undefined}>
      <legend className="text-sm font-medium text-ink">Book-value band boundaries ({currency})</legend>
      <p className="text-xs text-ink-faint">
        Each boundary closes a band (items up to and including it); items above the last boundary form the top band.
      </p>
      <ol className="space-y-2">
        {value.map((b, i) => (
          <li key={i} className="flex items-center gap-2">
            <span className="w-16 shrink-0 text-xs text-ink-soft">Band {i + 1} ≤</span>
            <Input
              aria-label={`Upper boundary of band ${i + 1}`}
              inputMode="decimal"
              className="figures max-w-44 text-right"
              value={b}
              onChange={(e) => set(i, e.target.value)}
            />
            {value.length > 1 && (
              <Button type="button" variant="ghost" onClick={() => remove(i)} aria-label={`Remove boundary ${i + 1}`}>
                Remove
              </Button>
            )}
          </li>
        ))}
        <li className="text-xs text-ink-soft">
          Band {value.length + 1}: above{" "}
          {/^\d+(\.\d{1,2})?$/.test(value.at(-1) ?? "") ? formatMoney(value.at(-1)) : "the last boundary"}
        </li>
      </ol>
      {value.length < 9 && (
        <Button type="button" variant="secondary" onClick={add}>
          Add a boundary
        </Button>
      )}
      <p id="strata-bounds-error" aria-live="polite" className="min-h-4 text-xs text-brick-700">
        {error}
      </p>
    </fieldset>
  );
}
