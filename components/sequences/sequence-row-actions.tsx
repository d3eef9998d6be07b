"use client";
/** Rename, duplicate, archive / unarchive for one row of the sequence list (engineers and admins). */
import { useState, type FormEvent } from "react";
import { useRouter } from "next/navigation";
import { sequenceName } from "@/lib/validation/sequences";
import type { SequenceListItem } from "@/lib/sequences/types";
import { apiFetch } from "@/components/ui/api-client";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";

interface Props {
  sequence: Pick<SequenceListItem, "id" | "name" | "status" | "latestRevision">;
  onError: (message: string | null) => void;
}

export function SequenceRowActions({ sequence, onError }: Props) {
  const router = useRouter();
  const [renaming, setRenaming] = useState(false);
  const [name, setName] = useState(sequence.name);
  const [busy, setBusy] = useState<null | "rename" | "duplicate" | "archive">(null);

  async function run(kind: "rename" | "duplicate" | "archive", action: () => Promise<unknown>) {
    setBusy(kind);
    onError(null);
    try {
      await action();
      router.refresh();
      return true;
    } catch (err) {
      onError(err instanceof Error ? err.message : "That did not work.");
      return false;
    } finally {
      setBusy(null);
    }
  }

  async function rename(event: FormEvent) {
    event.preventDefault();
    const parsed = sequenceName.safeParse(name);
    if (!parsed.success) return onError(parsed.error.issues[0].message);
    if (parsed.data === sequence.name) return setRenaming(false);
    const ok = await run("rename", () => apiFetch(`/api/sequences/${sequence.id}`, { method: "PATCH", body: { name: parsed.data } }));
    if (ok) setRenaming(false);
  }

  if (renaming) {
    return (
      <form onSubmit={rename} className="flex items-center gap-2">
        <Input
          aria-label={`New name for ${sequence.name}`}
          value={name}
          onChange={(e) => setName(e.target.value)}
          className="h-8 w-56"
          autoFocus
          onKeyDown={(e) => {
            if (e.key === "Escape") setRenaming(false);
          }}
        />
        <Button type="submit" size="sm" busy={busy === "rename"}>
          Save
        </Button>
        <Button size="sm" variant="ghost" onClick={() => setRenaming(false)}>
          Cancel
        </Button>
      </form>
    );
  }

  const archived = sequence.status === "archived";
  return (
    <div className="flex items-center justify-end gap-1">
      {!archived && (
        <Button size="sm" variant="ghost" onClick={() => setRenaming(true)} aria-label={`Rename ${sequence.name}`}>
          Rename
        </Button>
      )}
      <Button
        size="sm"
        variant="ghost"
        busy={busy === "duplicate"}
        disabled={!sequence.latestRevision}
        aria-label={`Duplicate ${sequence.name}`}
        onClick={() => run("duplicate", () => apiFetch(`/api/sequences/${sequence.id}/duplicate`, { body: {} }))}
      >
        Duplicate
      </Button>
      <Button
        size="sm"
        variant="ghost"
        busy={busy === "archive"}
        aria-label={`${archived ? "Unarchive" : "Archive"} ${sequence.name}`}
        onClick={() =>
          run("archive", () =>
            apiFetch(`/api/sequences/${sequence.id}`, { method: "PATCH", body: { status: archived ? "draft" : "archived" } }),
          )
        }
      >
        {archived ? "Unarchive" : "Archive"}
      </Button>
    </div>
  );
}
