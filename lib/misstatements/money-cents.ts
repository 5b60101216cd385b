import { centsToDecimal, decimalToCents } from "@/lib/money";

export const cents = (v: string) => decimalToCents(v);
export const dec = (c: bigint) => centsToDecimal(c);
export const abs = (c: bigint) => (c < 0n ? -c : c);
export const sum = (values: bigint[]) => values.reduce((a, b) => a + b, 0n);
/** A float amount from the engine, rounded half away from zero to whole cents. */
export const floatToCents = (v: number) => BigInt(Math.sign(v) * Math.round(Math.abs(v) * 100));
