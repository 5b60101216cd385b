export function Alert({
  tone = "error",
  children,
}: {
  tone?: "error" | "info" | "success";
  children: React.ReactNode;
}) {
  const styles = {
    error: "border-brick-100 bg-brick-50 text-brick-700",
    info: "border-slate-100 bg-slate-50 text-slate-700",
    success: "border-ledger-100 bg-ledger-50 text-ledger-700",
  }[tone];
  return (
    <div role={tone === "error" ? "alert" : "status"} className={`rounded-md border px-3 py-2 text-sm ${styles}`}>
      {children}
    </div>
  );
}
