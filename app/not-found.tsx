import Link from "next/link";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-md px-6 py-24 text-center">
      <p className="figures text-sm text-ink-faint">404</p>
      <h1 className="mt-2 text-xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-sm text-ink-soft">
        This page does not exist, or you are not on the engagement it belongs to.
      </p>
      <Link href="/engagements" className="mt-6 inline-block text-sm font-medium text-ledger-600 link">
        Back to engagements
      </Link>
    </div>
  );
}
