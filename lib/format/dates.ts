// The product's one date style and one date-time style live in lib/format/date.ts; this name stays for older imports.
export { formatDate, formatDateTime } from "./date";
