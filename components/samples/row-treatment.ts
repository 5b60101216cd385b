"use client";
import { createContext, useContext } from "react";
import type { TestDirection } from "@/lib/sampling";

/**
 * How the evaluation counts an item that could not be audited, given to the grid's rows by the
 * workspace from the evaluation view model: the words (`SampleEvaluation.unauditableOnRow`), said on
 * the row as soon as the status is chosen, and the direction tested (`SampleEvaluation.direction`),
 * which signs the row's misstatement as the evaluation counts it (lib/samples/item-misstatement.ts).
 */
export interface RowTreatment {
  unauditableOnRow: string;
  direction: TestDirection;
}

export const UnauditableTreatment = createContext<RowTreatment | null>(null);

export const useUnauditableTreatment = () => useContext(UnauditableTreatment);
