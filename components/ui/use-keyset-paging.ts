"use client";
import { useCallback, useMemo, useState } from "react";

type Seek = { after: string } | { before: string } | { last: true } | null;
interface State {
  pageIndex: number;
  pageSize: number;
  seek: Seek;
}
interface Cursors {
  nextCursor?: string | null;
  prevCursor?: string | null;
  total: number;
}

/**
 * Paging by key through an API that answers `nextCursor` / `prevCursor` (lib/validation/keyset.ts):
 * Next and Previous send the cursor of the page in hand, Last asks for `last=true`, and the page
 * number is kept here for display only.
 */
export function useKeysetPaging(initialPageSize: number) {
  const [state, setState] = useState<State>({ pageIndex: 0, pageSize: initialPageSize, seek: null });

  const query = useMemo(() => {
    const p: Record<string, string> = { page: String(state.pageIndex + 1), pageSize: String(state.pageSize) };
    if (state.seek && "after" in state.seek) p.after = state.seek.after;
    if (state.seek && "before" in state.seek) p.before = state.seek.before;
    if (state.seek && "last" in state.seek) p.last = "true";
    return p;
  }, [state]);
  const reset = useCallback(() => setState((s) => ({ ...s, pageIndex: 0, seek: null })), []);
  const setPageSize = (pageSize: number) => setState({ pageIndex: 0, pageSize, seek: null });
  const pageCount = (total: number) => Math.max(1, Math.ceil(total / state.pageSize));

  return {
    pageIndex: state.pageIndex,
    pageSize: state.pageSize,
    /** The query-string fields for the page asked for (a new object whenever it changes). */
    query,
    reset,
    setPageSize,
    pageCount,
    canPrevious: (page: Cursors | null) => state.pageIndex > 0 && !!page?.prevCursor,
    canNext: (page: Cursors | null) => !!page?.nextCursor,
    first: reset,
    previous: (page: Cursors | null) => {
      if (page?.prevCursor)
        setState((s) => ({
          ...s,
          pageIndex: Math.max(0, s.pageIndex - 1),
          seek: s.pageIndex <= 1 ? null : { before: page.prevCursor! },
        }));
    },
    next: (page: Cursors | null) => {
      if (page?.nextCursor) setState((s) => ({ ...s, pageIndex: s.pageIndex + 1, seek: { after: page.nextCursor! } }));
    },
    last: (page: Cursors | null) => {
      if (page)
        setState((s) => ({
          ...s,
          pageIndex: Math.max(0, Math.ceil(page.total / s.pageSize) - 1),
          seek: { last: true },
        }));
    },
  };
}
