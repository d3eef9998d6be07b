import "server-only";
import { desc, eq, and } from "drizzle-orm";
import type { Db } from "./index";
import { auditLog } from "./schema";

export interface AuditInput {
  actorId: string | null;
  /** Dotted verb, e.g. "project.create", "user.role-change", "auth.sign-in". */
  action: string;
  targetType: string;
  targetId?: string | null;
  details?: Record<string, unknown>;
}

export async function recordAudit(db: Db, entry: AuditInput): Promise<void> {
  await db.insert(auditLog).values({
    actorId: entry.actorId,
    action: entry.action,
    targetType: entry.targetType,
    targetId: entry.targetId ?? null,
    details: entry.details ?? {},
  });
}

export function auditFor(db: Db, targetType: string, targetId: string, limit = 100) {
  return db
    .select()
    .from(auditLog)
    .where(and(eq(auditLog.targetType, targetType), eq(auditLog.targetId, targetId)))
    .orderBy(desc(auditLog.at))
    .limit(limit);
}
