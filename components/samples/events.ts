/** Tells the sample workspace that something else on the page changed its figures (a workbook import). */
export const SAMPLE_CHANGED_EVENT = "sondage:sample-changed";
