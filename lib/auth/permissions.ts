import type { Role } from "./roles";

/**
 * THE permission table. Every page, server action and route handler asks `can()`;
 * nothing else decides who may do what. Vessel scope (which vessels a person sees)
 * is the second half of every check and lives in scope.ts. Only permissions that
 * something checks are listed: a feature adds its permission with its first check.
 */
export const PERMISSIONS = {
  /** Own account: who am I, my vessels. Every signed-in role. */
  "account.self": ["admin", "superintendent", "chief_engineer", "engineer"],
  /** Vessels, engines, units, inspection history — always limited by vessel scope. */
  "fleet.read": ["admin", "superintendent", "chief_engineer", "engineer"],
  "inspection.create": ["chief_engineer", "engineer"],
  "inspection.editDraft": ["chief_engineer", "engineer"],
  "inspection.submit": ["chief_engineer", "engineer"],
  /** Never a record one entered or submitted oneself: lib/inspections/approval.ts. */
  "inspection.approve": ["superintendent", "chief_engineer"],
  "inspection.return": ["superintendent", "chief_engineer"],
  "inspection.amend": ["chief_engineer"],
  "photo.upload": ["chief_engineer", "engineer"],
  "hoursLog.write": ["chief_engineer"],
  /** Renewal planning: plans for units, the ships' port stays and dockings, spares stock. */
  "outlook.plan": ["superintendent"],
  "schedule.write": ["superintendent"],
  "spares.write": ["superintendent", "admin"],
  /** Import readings from files: a gauge file into a draft, past records into the history (approved as inspections are). */
  "import.create": ["chief_engineer", "engineer"],
  /** Users, roles, vessel assignments, invitations. */
  "admin.users": ["admin"],
  /** Vessels, companies and main engines (with their cylinder units). */
  "admin.fleet": ["admin"],
  /** Engine profiles: bore, stations, limits from the maker's manual. */
  "admin.profiles": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

/** Whether `role` holds `permission`. Unknown roles hold nothing. */
export function can(role: Role | null | undefined, permission: Permission): boolean {
  if (!role) return false;
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

/** Every permission a role holds, e.g. to hand the client a list for hiding controls. */
export function permissionsOf(role: Role): Permission[] {
  return (Object.keys(PERMISSIONS) as Permission[]).filter((p) => can(role, p));
}

/** Admins see every vessel (to manage them); everyone else sees the vessels assigned to them. */
export function seesAllVessels(role: Role): boolean {
  return role === "admin";
}
