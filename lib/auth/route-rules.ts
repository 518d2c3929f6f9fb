import type { Permission } from "./permissions";

/**
 * Who may call what: one rule for every API route (path + method, the path written
 * the way the route folder is named) and every server action (by its exported name).
 *
 * - `permission` is looked up in the one permission table (permissions.ts).
 * - `vesselScoped` means the target belongs to a vessel, and the caller must also be
 *   assigned to that vessel; the handler names how to find the vessel, and the wrappers
 *   in api.ts / actions.ts refuse to build a scoped handler without that.
 * - `public` rules need no session (health, sign-in, accepting an invitation).
 *
 * The authorization-matrix test walks app/api/** /route.ts and every actions module
 * and fails when a route or action has no rule here, so nothing ships unguarded.
 */
export type AccessRule =
  | { public: true; why: string }
  | { public?: false; permission: Permission; vesselScoped: boolean };

export const API_ROUTE_RULES = {
  "GET /api/health": { public: true, why: "reachability probe; returns no data" },
  "GET /api/auth/[...all]": { public: true, why: "better-auth: session, sign-in callbacks" },
  "POST /api/auth/[...all]": { public: true, why: "better-auth: sign-in, sign-out, password reset" },
  "GET /api/me": { permission: "account.self", vesselScoped: false },
  "GET /api/admin/users": { permission: "admin.users", vesselScoped: false },
  "GET /api/vessels": { permission: "fleet.read", vesselScoped: false },
  "GET /api/vessels/[vesselId]": { permission: "fleet.read", vesselScoped: true },
  // stored analysis (the queries scope by vessel and answer 404 outside it)
  "GET /api/engines/[engineId]/analysis": { permission: "fleet.read", vesselScoped: true },
  "GET /api/units/[unitId]/analysis": { permission: "fleet.read", vesselScoped: true },
  // inspections: entry, workflow and photos (vessel of the unit / inspection)
  "POST /api/inspections": { permission: "inspection.create", vesselScoped: true },
  "GET /api/inspections/[inspectionId]": { permission: "fleet.read", vesselScoped: true },
  "PUT /api/inspections/[inspectionId]": { permission: "inspection.editDraft", vesselScoped: true },
  "DELETE /api/inspections/[inspectionId]": { permission: "inspection.editDraft", vesselScoped: true },
  "POST /api/inspections/[inspectionId]/submit": { permission: "inspection.submit", vesselScoped: true },
  "POST /api/inspections/[inspectionId]/approve": { permission: "inspection.approve", vesselScoped: true },
  "POST /api/inspections/[inspectionId]/return": { permission: "inspection.return", vesselScoped: true },
  "POST /api/inspections/[inspectionId]/amend": { permission: "inspection.amend", vesselScoped: true },
  "POST /api/inspections/[inspectionId]/photos": { permission: "photo.upload", vesselScoped: true },
  "POST /api/inspections/[inspectionId]/photos/complete": { permission: "photo.upload", vesselScoped: true },
  "GET /api/inspections/[inspectionId]/photos/[photoId]": { permission: "fleet.read", vesselScoped: true },
  "DELETE /api/inspections/[inspectionId]/photos/[photoId]": { permission: "photo.upload", vesselScoped: true },
  // renewal outlook: rows scoped by the query; plans by the unit's vessel, schedule by the vessel
  "GET /api/outlook": { permission: "fleet.read", vesselScoped: false },
  "POST /api/units/[unitId]/plans": { permission: "outlook.plan", vesselScoped: true },
  "PUT /api/units/[unitId]/plans/[planId]": { permission: "outlook.plan", vesselScoped: true },
  "GET /api/vessels/[vesselId]/schedule": { permission: "fleet.read", vesselScoped: true },
  "POST /api/vessels/[vesselId]/schedule": { permission: "schedule.write", vesselScoped: true },
  "PUT /api/vessels/[vesselId]/schedule/[entryId]": { permission: "schedule.write", vesselScoped: true },
  "DELETE /api/vessels/[vesselId]/schedule/[entryId]": { permission: "schedule.write", vesselScoped: true },
  "POST /api/spares": { permission: "spares.write", vesselScoped: false },
  "PUT /api/spares/[spareId]": { permission: "spares.write", vesselScoped: false },
  // scheduled jobs: a scheduler has no session; the secret JOBS_TOKEN is its credential
  "POST /api/jobs/digest": { public: true, why: "authorized by the JOBS_TOKEN bearer token, compared in constant time" },
  // imports from files (the vessel named in the body or query, or the import's vessel)
  "POST /api/imports/uploads": { permission: "import.create", vesselScoped: true },
  "POST /api/imports": { permission: "import.create", vesselScoped: true },
  "GET /api/imports": { permission: "fleet.read", vesselScoped: true },
  "GET /api/imports/[importId]": { permission: "fleet.read", vesselScoped: true },
  "GET /api/imports/[importId]/file": { permission: "fleet.read", vesselScoped: true },
  "POST /api/imports/[importId]/commit": { permission: "import.create", vesselScoped: true },
  "POST /api/imports/[importId]/approve": { permission: "inspection.approve", vesselScoped: true },
} as const satisfies Record<string, AccessRule>;

export const ACTION_RULES = {
  // invitations and accounts
  inviteUserAction: { permission: "admin.users", vesselScoped: false },
  resendInvitationAction: { permission: "admin.users", vesselScoped: false },
  revokeInvitationAction: { permission: "admin.users", vesselScoped: false },
  updateUserAccessAction: { permission: "admin.users", vesselScoped: false },
  deactivateUserAction: { permission: "admin.users", vesselScoped: false },
  reactivateUserAction: { permission: "admin.users", vesselScoped: false },
  acceptInvitationAction: { public: true, why: "the invitation token is the credential" },
  requestNewInvitationAction: { public: true, why: "only e-mails the inviter about a known token" },
  // fleet set-up
  saveVesselAction: { permission: "admin.fleet", vesselScoped: false },
  createEngineAction: { permission: "admin.fleet", vesselScoped: false },
  saveProfileAction: { permission: "admin.profiles", vesselScoped: false },
  saveCompanySettingsAction: { permission: "admin.fleet", vesselScoped: false },
  // the engine's running-hours log (the engine's vessel)
  logRunningHoursAction: { permission: "hoursLog.write", vesselScoped: true },
  // notifications: each person's own e-mail preferences
  savePreferencesAction: { permission: "account.self", vesselScoped: false },
} as const satisfies Record<string, AccessRule>;

export type ApiRouteKey = keyof typeof API_ROUTE_RULES;
export type ActionName = keyof typeof ACTION_RULES;

export function apiRouteRule(key: string): AccessRule | undefined {
  return (API_ROUTE_RULES as Record<string, AccessRule>)[key];
}

export function actionRule(name: string): AccessRule | undefined {
  return (ACTION_RULES as Record<string, AccessRule>)[name];
}
