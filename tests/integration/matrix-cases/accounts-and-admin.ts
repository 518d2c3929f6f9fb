import { freshImo, request, throwawayInvitation, throwawayUser, unique, type ActionCase, type RouteCase } from "../../support/matrix";

// Cases for the platform routes, invitations and the admin screens.

export const routeCases: Record<string, RouteCase> = {
  "GET /api/health": async () => ({ request: request("GET", "/api/health") }),
  "GET /api/auth/[...all]": async () => ({ request: request("GET", "/api/auth/get-session"), params: { all: ["get-session"] } }),
  "POST /api/auth/[...all]": async () => ({ request: request("POST", "/api/auth/sign-out", {}), params: { all: ["sign-out"] } }),
  "GET /api/me": async () => ({ request: request("GET", "/api/me") }),
  "GET /api/admin/users": async () => ({ request: request("GET", "/api/admin/users") }),
  "GET /api/vessels": async () => ({ request: request("GET", "/api/vessels") }),
  "GET /api/vessels/[vesselId]": async (w) => ({ request: request("GET", `/api/vessels/${w.vessel1}`), params: { vesselId: String(w.vessel1) } }),
};

export const actionCases: Record<string, ActionCase> = {
  inviteUserAction: async (w) => ({ name: "New Person", email: `${unique("new")}@roles.test`, role: "engineer", vesselIds: [String(w.vessel1)] }),
  resendInvitationAction: async (w) => ({ invitationId: (await throwawayInvitation(w)).id }),
  revokeInvitationAction: async (w) => ({ invitationId: (await throwawayInvitation(w)).id }),
  updateUserAccessAction: async (w) => ({ userId: await throwawayUser(), role: "chief_engineer", vesselIds: [w.vessel1] }),
  deactivateUserAction: async () => ({ userId: await throwawayUser() }),
  reactivateUserAction: async () => ({ userId: await throwawayUser() }),
  acceptInvitationAction: async (w) => ({ token: (await throwawayInvitation(w)).token, password: "A-long-enough-password", confirmPassword: "A-long-enough-password" }),
  requestNewInvitationAction: async (w) => ({ token: (await throwawayInvitation(w, true)).token }),
  saveVesselAction: async (w) => ({ name: unique("Vessel"), imoNumber: freshImo(), companyId: w.companyId, newCompanyName: "", vesselType: "", flag: "", builtYear: "" }),
  saveCompanySettingsAction: async (w) => ({ companyId: w.companyId, currencyCode: "USD", alertHorizonDays: 183, alertPercent: 20 }),
  createEngineAction: async (w) => ({ vesselId: w.vessel2, profileId: w.profileId, serial: unique("SER"), cylinderCount: 5, commissionedOn: "" }),
  saveProfileAction: async () => ({
    name: unique("Profile"),
    designation: "T-500",
    boreMm: 500,
    strokeMm: "",
    linerWearLimitMm: 3,
    ovalityLimitMm: 1,
    wearReference: "nominal",
    temperatureCorrection: true,
    linerMaterial: "Grey cast iron",
    alphaLinerPpmPerK: 10.5,
    gaugeMaterial: "Carbon steel",
    alphaGaugePpmPerK: 11.5,
    runningInHours: 3000,
    minPointsForProjection: 3,
    axisAKey: "fa",
    axisALabel: "Fore–aft",
    axisBKey: "ath",
    axisBLabel: "Athwartships",
    overhaulIntervalHours: 16000,
    rodNutPressureBar: "",
    notes: "",
    stations: [
      { key: "a", label: "Top", depthMm: 30, role: "unworn_top" },
      { key: "b", label: "TDC", depthMm: 100, role: "ring_tdc" },
      { key: "c", label: "Mid", depthMm: 500, role: "intermediate" },
    ],
    rings: [{ label: "Ring 1", gapNewMinMm: 2.5, gapNewMaxMm: 3, gapLimitMm: 5.5, grooveNewMinMm: 0.3, grooveNewMaxMm: 0.4, grooveLimitMm: 0.8 }],
  }),
};
