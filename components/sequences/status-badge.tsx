import { Badge } from "@/components/ui/badge";
import type { SequenceStatusValue } from "@/lib/validation/sequences";
import { STATUS_LABELS, STATUS_TONES } from "./format";

export function StatusBadge({ status }: { status: SequenceStatusValue }) {
  return <Badge tone={STATUS_TONES[status]}>{STATUS_LABELS[status]}</Badge>;
}
