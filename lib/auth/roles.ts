/**
 * Roles use the trade's titles. This file has no server imports so client code can
 * label roles and hide what a role cannot do (the server refuses it anyway).
 */
export const ROLES = ["admin", "superintendent", "chief_engineer", "engineer"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  superintendent: "Technical superintendent",
  chief_engineer: "Chief engineer",
  engineer: "Engineer (2nd / 3rd)",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
