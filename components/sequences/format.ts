/** Display helpers for sequence pages: short hashes, dates in one fixed style, status labels. */
import type { SequenceStatusValue } from "@/lib/validation/sequences";
import type { BadgeTone } from "@/components/ui/badge";

/** The first 10 hex digits: enough to tell revisions apart at a glance; the full hash is in the title. */
export function shortHash(hash: string): string {
  return hash.slice(0, 10);
}

/**
 * en-GB, 24 h, in UTC and saying so: the server render and the browser then print the same text (no
 * hydration mismatch), and an audit trail read across sites has one clock.
 */
export function formatTime(iso: string): string {
  const text = new Date(iso).toLocaleString("en-GB", {
    day: "numeric",
    month: "short",
    year: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    timeZone: "UTC",
  });
  return `${text} UTC`;
}

export const STATUS_LABELS: Record<SequenceStatusValue, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  released: "Released",
  archived: "Archived",
};

export const STATUS_TONES: Record<SequenceStatusValue, BadgeTone> = {
  draft: "neutral",
  in_review: "ember",
  approved: "glass",
  released: "glass",
  archived: "neutral",
};
