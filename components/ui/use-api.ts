import { useCallback, useEffect, useRef, useState } from "react";
import useSWR, { useSWRConfig, type KeyedMutator } from "swr";
import { apiFetch } from "./api";

/** SWR's fetcher for our route handlers: the key is the URL, a refusal throws `ApiError`. */
export const apiFetcher = <T>(url: string) => apiFetch<T>(url);

/** How every read behaves: no refetch on focus or reconnect (screens refetch after their own writes), no retries. */
export const API_READ_OPTIONS = {
  revalidateOnFocus: false,
  revalidateOnReconnect: false,
  shouldRetryOnError: false,
} as const;

export interface ApiRead<T> {
  data: T | undefined;
  error: Error | undefined;
  isLoading: boolean;
  /** True while a (re)fetch is under way, including one behind data already shown. */
  isValidating: boolean;
  /** Refetches (or, given data, sets) the answer for this URL. */
  mutate: KeyedMutator<T>;
  /** Refetches after a write and answers the new data; unlike `mutate()`, throws the `ApiError`. */
  reload: () => Promise<T | undefined>;
}

/**
 * Reads `url` (null: nothing to read yet). Answers are cached by URL and only the latest request
 * for a URL counts, so an answer that arrives late — for an item no longer selected, or from an
 * older refetch — is never shown. With `initial` (the server page's data) nothing is fetched on
 * mount (unless an earlier visit left an answer in the cache, which may be older than the page:
 * then it is refetched at once); a new `revision` (a counter a parent bumps when something changed elsewhere) refetches,
 * keeping the data shown until the answer lands. With `keepPreviousData` (a paged grid) the
 * previous URL's answer stays shown while the next page loads. No refetch on focus or reconnect:
 * screens refetch after their own writes.
 */
export function useApi<T>(
  url: string | null,
  options: { initial?: T; revision?: number; keepPreviousData?: boolean } = {},
): ApiRead<T> {
  const { initial, revision, keepPreviousData = false } = options;
  const { cache } = useSWRConfig();
  const [cachedAtMount] = useState(() => url !== null && cache.get(url)?.data !== undefined);
  const { data, error, isLoading, isValidating, mutate } = useSWR<T, Error>(url, apiFetcher<T>, {
    fallbackData: initial,
    revalidateOnMount: initial === undefined || cachedAtMount,
    keepPreviousData,
    ...API_READ_OPTIONS,
  });
  const seenRevision = useRef(revision);
  useEffect(() => {
    if (revision === seenRevision.current) return;
    seenRevision.current = revision;
    void mutate();
  }, [revision, mutate]);
  const reload = useCallback(
    () => (url === null ? Promise.resolve(undefined) : mutate(apiFetcher<T>(url), { revalidate: false })),
    [url, mutate],
  );
  return { data, error, isLoading, isValidating, mutate, reload };
}
