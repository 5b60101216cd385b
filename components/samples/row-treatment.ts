"use client";
import { createContext, useContext } from "react";

/**
 * How the evaluation counts an item that could not be audited (`SampleEvaluation.unauditableOnRow`),
 * given to the grid's rows by the workspace so each such row says it as soon as the status is chosen.
 */
export const UnauditableTreatment = createContext<string | null>(null);

export const useUnauditableTreatment = () => useContext(UnauditableTreatment);
