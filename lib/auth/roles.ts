/**
 * What each role may do (PRODUCT.md "Who uses it"). Pure: used by handlers (the check), by pages
 * (to hide controls) and by tests. Admin may do everything.
 */
// Defined here, not in db/schema.ts, so client components can import roles without drizzle.
export const ROLES = ["admin", "engineer", "clinician", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = {
  "users:manage": ["admin"],
  "projects:create": ["admin", "engineer"],
  "projects:manage-members": ["admin", "engineer"],
  "sequences:edit": ["admin", "engineer"],
  "sequences:submit": ["admin", "engineer"],
  "rig:edit": ["admin", "engineer"],
  "bench-logs:upload": ["admin", "engineer"],
  "runs:create": ["admin", "engineer", "clinician"],
  "cases:edit": ["admin", "engineer", "clinician"],
  "reviews:comment": ["admin", "clinician"],
  "reviews:decide": ["admin", "clinician"],
  "sign-offs:sign": ["admin", "clinician"],
  "releases:release": ["admin"],
  "exports:download": ["admin", "engineer", "clinician", "viewer"],
  read: ["admin", "engineer", "clinician", "viewer"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export const isRole = (value: unknown): value is Role => typeof value === "string" && (ROLES as readonly string[]).includes(value);

/** Draft and edit sequences (and their revisions). */
export const canEdit = (role: Role) => can(role, "sequences:edit");
export const canCreateProject = (role: Role) => can(role, "projects:create");
export const canManageUsers = (role: Role) => can(role, "users:manage");
export const canEditRig = (role: Role) => can(role, "rig:edit");
export const canRunSimulations = (role: Role) => can(role, "runs:create");
export const canUploadBenchLogs = (role: Role) => can(role, "bench-logs:upload");
export const canSubmitForReview = (role: Role) => can(role, "sequences:submit");
export const canEditPatientCases = (role: Role) => can(role, "cases:edit");
export const canComment = (role: Role) => can(role, "reviews:comment");
export const canReview = (role: Role) => can(role, "reviews:decide");
export const canSign = (role: Role) => can(role, "sign-offs:sign");
export const canRelease = (role: Role) => can(role, "releases:release");

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  engineer: "Engineer",
  clinician: "Clinician",
  viewer: "Viewer",
};

export const ROLE_SUMMARIES: Record<Role, string> = {
  admin: "Everything, plus users, roles, releases and exports",
  engineer: "Drafts sequences, rig profile, patient cases, runs, bench logs; submits for review",
  clinician: "Reviews runs, authors patient cases, comments, approves and signs",
  viewer: "Reads everything, changes nothing",
};
