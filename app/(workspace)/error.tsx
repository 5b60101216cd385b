"use client";

export default function WorkspaceError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="rounded-card border border-brick-100 bg-brick-50 p-6">
      <h1 className="font-semibold text-brick-700">This page could not be shown</h1>
      <p className="mt-1 text-sm text-brick-700">
        The error has been logged{error.digest ? ` (reference ${error.digest})` : ""}. Nothing you entered was saved
        partly.
      </p>
      <button type="button" onClick={reset} className="mt-4 text-sm font-medium text-brick-700 underline">
        Try again
      </button>
    </div>
  );
}
