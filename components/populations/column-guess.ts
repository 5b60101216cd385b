/** First header whose name suggests the role, for the mapping screen's starting choices. */
const PATTERNS = {
  itemRef:
    /^(item|invoice|inv|document|doc|reference|ref|voucher|entry|id|number|no\.?|r[ée]f[ée]rence|n[°o]|pi[eè]ce|beleg)\b|ref(erence)?$|\b(no|number|id)$/i,
  bookValue: /amount|book value|balance|value|total|montant|solde|betrag|importe|net/i,
  description: /customer|client|supplier|vendor|description|name|narrative|memo|libell[ée]|tiers/i,
  date: /date|posted|due|[ée]ch[ée]ance|datum/i,
};

export type ColumnRole = keyof typeof PATTERNS;

export function guessColumns(headers: string[]): Record<ColumnRole, string> {
  const taken = new Set<string>();
  const pick = (role: ColumnRole) => {
    const found = headers.find((h) => !taken.has(h) && PATTERNS[role].test(h.trim())) ?? "";
    if (found) taken.add(found);
    return found;
  };
  const itemRef = pick("itemRef");
  const bookValue = pick("bookValue");
  return { itemRef, bookValue, description: pick("description"), date: pick("date") };
}
