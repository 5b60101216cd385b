import { Badge } from "@/components/ui/badge";
import type { RequestItemStatus } from "@/lib/validation/requests";
import { REQUEST_STATUS_LABELS, STATUS_TONE } from "./labels";

export function RequestStatusBadge({ status }: { status: RequestItemStatus }) {
  return <Badge tone={STATUS_TONE[status]}>{REQUEST_STATUS_LABELS[status]}</Badge>;
}
