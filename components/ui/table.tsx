import type { ComponentPropsWithoutRef } from "react";

/**
 * Cell padding for a whole table, set once on <Table> (cells keep only their alignment):
 * `list` rows on a card, flush with its edges; `compact` the figures of a result panel;
 * `boxed` a table in its own bordered box.
 */
const DENSITY = {
  list: "[&_th]:py-2 [&_th]:pr-4 [&_td]:py-2.5 [&_td]:pr-4 [&_th:last-child]:pr-0 [&_td:last-child]:pr-0",
  compact: "[&_th]:py-1.5 [&_th]:pr-2 [&_td]:py-1.5 [&_td]:pr-2 [&_th:last-child]:pr-0 [&_td:last-child]:pr-0",
  boxed: "[&_th]:px-4 [&_th]:py-2 [&_td]:px-4 [&_td]:py-2.5",
} as const;

interface TableProps extends ComponentPropsWithoutRef<"table"> {
  /** The table's accessible name. */
  label?: string;
  density?: keyof typeof DENSITY;
}

/** A hand-laid table (the data grids have their own): full width, small text unless told, named for assistive technology. */
export function Table({ label, density, className = "", ...props }: TableProps) {
  const size = /(^|\s)text-(xs|sm|base)(\s|$)/.test(className) ? "" : "text-sm";
  return (
    <table aria-label={label} className={`w-full ${size} ${density ? DENSITY[density] : ""} ${className}`} {...props} />
  );
}

/** Column headers: small capitals in the soft ink. */
export function THead({ className = "", ...props }: ComponentPropsWithoutRef<"thead">) {
  return <thead className={`text-left text-xs uppercase tracking-wider text-ink-soft ${className}`} {...props} />;
}

export type SortDirection = "asc" | "desc" | false;

interface ThProps extends ComponentPropsWithoutRef<"th"> {
  /** A column of figures: right-aligned like its cells. */
  numeric?: boolean;
  /** A sortable column: its header becomes a button with the order shown and announced (aria-sort). */
  sort?: { direction: SortDirection; onToggle: (event: React.MouseEvent<HTMLButtonElement>) => void };
}

const ARIA_SORT = { asc: "ascending", desc: "descending" } as const;
const hasWeight = (className: string) => /(^|\s)font-(normal|medium|semibold|bold)(\s|$)/.test(className);

/** A header cell (scope "col" unless told "row"); semibold unless its class names a weight. */
export function Th({ numeric = false, sort, scope = "col", className = "", children, ...props }: ThProps) {
  const classes = `${hasWeight(className) ? "" : "font-semibold"} ${numeric ? "text-right" : "text-left"} ${className}`;
  return (
    <th
      scope={scope}
      aria-sort={sort?.direction ? ARIA_SORT[sort.direction] : undefined}
      className={classes}
      {...props}
    >
      {sort ? (
        <button
          type="button"
          onClick={sort.onToggle}
          className="inline-flex items-center gap-1 uppercase hover:text-ink"
        >
          {children}
          <span aria-hidden className="text-ink-faint">
            {sort.direction === "asc" ? "▲" : sort.direction === "desc" ? "▼" : "↕"}
          </span>
        </button>
      ) : (
        children
      )}
    </th>
  );
}

/** A body cell; `numeric` sets figures in tabular type, right-aligned. */
export function Td({
  numeric = false,
  className = "",
  ...props
}: ComponentPropsWithoutRef<"td"> & { numeric?: boolean }) {
  return <td className={`${numeric ? "figures text-right" : ""} ${className}`} {...props} />;
}
