/**
 * The JSON shapes of the sequences API (team-notes "Sequences API"), shared by the query modules that
 * build them and the client components that show them. No runtime imports: client code reads this
 * instead of anything under db/.
 */
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import type { Problem } from "@/machines/checks/types";
import type { SequenceStatusValue } from "@/lib/validation/sequences";

export interface RevisionAuthor {
  id: string | null;
  name: string;
}

export interface SequenceListItem {
  id: string;
  name: string;
  status: SequenceStatusValue;
  updatedAt: string;
  latestRevision: {
    number: number;
    hash: string;
    createdAt: string;
    message: string;
    author: RevisionAuthor;
  } | null;
}

export interface RevisionSummary {
  id: string;
  number: number;
  message: string;
  hash: string;
  createdAt: string;
  author: RevisionAuthor;
}

export interface RevisionDetail extends RevisionSummary {
  definition: SequenceDefinition;
  layout: SequenceLayout;
}

export interface RevisionView extends RevisionDetail {
  problems: Problem[];
}

export interface SequenceView {
  id: string;
  projectId: string;
  name: string;
  status: SequenceStatusValue;
  createdAt: string;
  updatedAt: string;
  latestRevision: number | null;
  canEdit: boolean;
}

export interface TemplateSummary {
  id: string;
  title: string;
  description: string;
}
