import type { SampleRecord } from "@/lib/data/samples";

/** Methods the advisor compares estimators for (stratified and attribute plans are not simulated). */
export const ADVISED_METHODS: readonly SampleRecord["method"][] = ["random", "systematic", "mus"];
