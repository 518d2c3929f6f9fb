import fc from "fast-check";
import { db } from "@/lib/db/knex";
import { randomToken } from "@/lib/inspections/form";
import { discardDraft, submitInspection } from "@/lib/inspections/mutations";
import type { InspectionDraft } from "@/lib/inspections/schemas";
import { fuzzCase, hostileString, mutatedFrom, type EchoField, type FuzzCase, type FuzzInput } from "../../support/fuzz";
import { approvedOn, clearOpenDrafts, daysAgo, draftOn, makeImage, photoOn, readyUnit, submittedOn, uploadToSlot } from "../../support/inspection-builders";
import type { RoleWorld } from "../../support/role-world";

// Fuzz cases for the inspection entry, workflow and photo routes, all aimed at records on
// vessel 1 of the fuzz world (built once, through the real mutations, one unit per purpose).

type Person = { id: string; name: string };
type Fx = {
  world: RoleWorld;
  engineer: Person;
  chief: Person;
  units: number[];
  otherVesselDraft: number;
  /** A draft with every cell (GET, PUT, photos). */
  draft: { id: number; draft: InspectionDraft };
  photoId: number;
  discardable: number;
  complete: number;
  submitted: number;
  toReturn: number;
  approved: number;
  createBody: Record<string, unknown>;
};

let built: Promise<Fx> | null = null;
const person = (u: { id: string; name: string }) => ({ id: u.id, name: u.name });

async function build(world: RoleWorld): Promise<Fx> {
  const engineer = person(world.users.engineer);
  const chief = person(world.users.chief);
  const units = (await db("cylinder_units").where({ engine_id: world.engine1 }).orderBy("cylinder_no").select("id")).map((r) => r.id as number);
  const other = (await db("cylinder_units").where({ engine_id: world.engine2 }).orderBy("cylinder_no").first("id")).id as number;
  const otherVesselDraft = (await draftOn(other, person(world.users.engineer2), { complete: false })).id;
  const d = await draftOn(units[1], engineer);
  const photo = await photoOn(d.id, engineer);
  const discardable = (await draftOn(units[2], engineer, { complete: false })).id;
  const complete = (await draftOn(units[3], engineer)).id;
  const submitted = (await submittedOn(units[4], engineer)).id;
  const toReturn = (await submittedOn(units[5], engineer)).id;
  const approved = (await approvedOn(units[0], engineer, chief)).id;
  const ctx = await readyUnit(units[0]);
  const engineHours = Math.max(39_000, ctx.previous?.engineHours ?? 0);
  const createBody = {
    unitId: units[0],
    clientToken: "CLIENT_TOKEN",
    inspectedOn: daysAgo(0),
    engineHours,
    linerHours: engineHours - 10_000,
    linerHoursReason: null,
    crew: "3/E",
    gaugeTempC: 24,
    linerTempC: 30,
  };
  return { world, engineer, chief, units, otherVesselDraft, draft: { id: d.id, draft: d.draft }, photoId: photo.id, discardable, complete, submitted, toReturn, approved, createBody };
}

const setup = (world: RoleWorld) => (built ??= build(world));

/** The record the params name: ours, or one on the other vessel. */
const inspectionParam = (id: number, fx: Fx, extra: Record<string, string> = {}) =>
  fc.constantFrom(id, id, id, fx.otherVesselDraft).map((i) => ({ inspectionId: String(i), ...extra }));

const revisionOf = async (id: number) => ((await db("inspections").where({ id }).first("revision"))?.revision as number) ?? 1;

/** Bodies carry "CURRENT" where the record's revision goes and "CLIENT_TOKEN" for a fresh token (or save id). */
function fillIn(id: () => number) {
  return async (_fx: Fx, input: FuzzInput): Promise<FuzzInput> => {
    const b = input.body as Record<string, unknown> | undefined;
    if (!b || typeof b !== "object" || Array.isArray(b)) return input;
    const out = { ...b };
    if (out.revision === "CURRENT") out.revision = await revisionOf(id());
    if (out.clientToken === "CLIENT_TOKEN") out.clientToken = randomToken(24);
    if (out.saveId === "CLIENT_TOKEN") out.saveId = randomToken(24);
    return { ...input, body: out };
  };
}

const getDraft = (fx: Fx, call: Parameters<EchoField<Fx>["readBack"]>[1], id = fx.draft.id) =>
  call("GET /api/inspections/[inspectionId]", { params: { inspectionId: String(id) } }).then((r) => (r.json as { draft: InspectionDraft }).draft);

/** A draft text field: PUT the fixture's draft with `text` put in by `set`, then read it back with GET. */
const draftText = (field: string, set: (d: InspectionDraft, text: string) => void, get: (d: InspectionDraft) => unknown): EchoField<Fx> => ({
  field,
  send: async (fx, text) => {
    const draft = structuredClone(fx.draft.draft);
    set(draft, text);
    return { params: { inspectionId: String(fx.draft.id) }, body: { revision: await revisionOf(fx.draft.id), draft } };
  },
  readBack: async (fx, call) => get(await getDraft(fx, call)),
});

export const fuzzCases: Record<string, FuzzCase<Fx>> = {
  "POST /api/inspections": fuzzCase({
    as: "engineer",
    setup,
    body: (fx) => mutatedFrom(fx.createBody),
    prepare: async (fx, input) => {
      // A unit holds one open draft (a create answers it): clear it now and then so creates go all the way.
      if (Math.random() < 0.3) await clearOpenDrafts(fx.units[0]);
      return fillIn(() => 0)(fx, input);
    },
    echo: ["crew", "linerHoursReason"].map((field) => ({
      field,
      send: async (fx, text) => {
        await clearOpenDrafts(fx.units[0]);
        return { body: { ...fx.createBody, clientToken: randomToken(24), [field]: text } };
      },
      readBack: async (fx, call, sent) => (await getDraft(fx, call, (sent.json as { id: number }).id)).header[field as "crew"],
    })),
  }),
  "GET /api/inspections/[inspectionId]": fuzzCase({ as: "supt", setup, params: (fx) => inspectionParam(fx.draft.id, fx) }),
  "PUT /api/inspections/[inspectionId]": fuzzCase({
    as: "engineer",
    setup,
    params: (fx) => inspectionParam(fx.draft.id, fx),
    body: (fx) => mutatedFrom({ revision: "CURRENT", draft: fx.draft.draft, saveId: "CLIENT_TOKEN" }),
    prepare: (fx, input) => fillIn(() => fx.draft.id)(fx, input),
    echo: [
      draftText("header.crew", (d, t) => (d.header.crew = t), (d) => d.header.crew),
      draftText("header.notes", (d, t) => (d.header.notes = t), (d) => d.header.notes),
      draftText("readings.0.warningConfirmed", (d, t) => (d.readings[0].warningConfirmed = t), (d) => d.readings[0].warningConfirmed),
      draftText("rings.0.condition", (d, t) => (d.rings[0].condition = t), (d) => d.rings[0].condition),
      draftText("checklist.tally.0.label", (d, t) => (d.checklist.tally[0].label = t), (d) => d.checklist.tally[0].label),
      draftText("checklist.closing.signedName", (d, t) => (d.checklist.closing.signedName = t), (d) => d.checklist.closing.signedName),
      draftText("checklist.stuffingBox.note", (d, t) => (d.checklist.stuffingBox.note = t), (d) => d.checklist.stuffingBox.note),
    ],
  }),
  "DELETE /api/inspections/[inspectionId]": fuzzCase({ as: "engineer", setup, params: (fx) => inspectionParam(fx.discardable, fx) }),
  "POST /api/inspections/[inspectionId]/submit": fuzzCase({
    as: "engineer",
    setup,
    params: (fx) => inspectionParam(fx.complete, fx),
    body: () => mutatedFrom({ revision: "CURRENT" }),
    prepare: (fx, input) => fillIn(() => fx.complete)(fx, input),
  }),
  "POST /api/inspections/[inspectionId]/approve": fuzzCase({
    as: "chief",
    setup,
    params: (fx) => inspectionParam(fx.submitted, fx),
    body: () => mutatedFrom({}),
  }),
  "POST /api/inspections/[inspectionId]/return": fuzzCase({
    as: "chief",
    setup,
    params: (fx) => inspectionParam(fx.toReturn, fx),
    body: () => mutatedFrom({ comment: "Re-gauge station s2, please." }, hostileString()),
    echo: [
      {
        field: "comment",
        send: async (fx, text) => {
          // The record the last string returned is submitted again (cheaper than a new one).
          const row = await db("inspections").where({ id: fx.toReturn }).first("state");
          if (row.state === "returned") await submitInspection(fx.engineer, fx.toReturn, undefined);
          return { params: { inspectionId: String(fx.toReturn) }, body: { comment: text } };
        },
        readBack: async (_fx, call, sent) =>
          ((await call("GET /api/inspections/[inspectionId]", { params: { inspectionId: String((sent.json as { id: number }).id) } })).json as { returnComment: string }).returnComment,
      },
    ],
  }),
  "POST /api/inspections/[inspectionId]/amend": fuzzCase({
    as: "chief",
    setup,
    params: (fx) => inspectionParam(fx.approved, fx),
    body: () => mutatedFrom({ reason: "Typing error at station s3.", clientToken: "CLIENT_TOKEN" }),
    prepare: (fx, input) => fillIn(() => fx.approved)(fx, input),
    echo: [
      {
        field: "reason",
        send: async (fx, text) => {
          // One open amendment at a time: discard the one the last string opened.
          const open = await db("inspections").where({ supersedes_id: fx.approved, state: "draft" }).first("id", "created_by");
          if (open) await discardDraft({ id: open.created_by, name: "" }, open.id);
          return { params: { inspectionId: String(fx.approved) }, body: { reason: text, clientToken: randomToken(24) } };
        },
        readBack: async (_fx, call, sent) =>
          ((await call("GET /api/inspections/[inspectionId]", { params: { inspectionId: String((sent.json as { id: number }).id) } })).json as { amendmentReason: string })
            .amendmentReason,
      },
    ],
  }),
  "POST /api/inspections/[inspectionId]/photos": fuzzCase({
    as: "engineer",
    setup,
    params: (fx) => inspectionParam(fx.draft.id, fx),
    body: () => mutatedFrom({ fileName: "liner s2.jpg", contentType: "image/jpeg", sizeBytes: 123_456 }),
    // A reserved slot is a pending stored_files row even before the upload: refused requests still write nothing.
  }),
  "POST /api/inspections/[inspectionId]/photos/complete": fuzzCase({
    as: "engineer",
    setup,
    params: (fx) => inspectionParam(fx.draft.id, fx),
    body: () => mutatedFrom({ fileId: 1, caption: "Scuffing at s2", stationKey: "s2", ringPosition: null }),
    prepare: async (fx, input) => {
      // A real upload to complete, most of the time.
      const b = input.body as Record<string, unknown> | undefined;
      if (b && typeof b === "object" && b.fileId === 1 && Math.random() < 0.7) {
        const slot = await uploadToSlot(fx.draft.id, fx.engineer, await makeImage("png"));
        return { ...input, body: { ...b, fileId: slot.fileId } };
      }
      return input;
    },
    echo: [
      {
        field: "caption",
        send: async (fx, text) => {
          const slot = await uploadToSlot(fx.draft.id, fx.engineer, await makeImage("png"));
          return { params: { inspectionId: String(fx.draft.id) }, body: { fileId: slot.fileId, caption: text, stationKey: null, ringPosition: null } };
        },
        readBack: async (fx, call, sent) => {
          const id = (sent.json as { id: number }).id;
          const dto = (await call("GET /api/inspections/[inspectionId]", { params: { inspectionId: String(fx.draft.id) } })).json as { photos: { id: number; caption: string }[] };
          return dto.photos.find((p) => p.id === id)?.caption;
        },
      },
    ],
  }),
  "GET /api/inspections/[inspectionId]/photos/[photoId]": fuzzCase({
    as: "chief",
    setup,
    params: (fx) => fc.tuple(inspectionParam(fx.draft.id, fx), fc.constantFrom(String(fx.photoId), String(fx.photoId + 1), "1")).map(([p, photoId]) => ({ ...p, photoId })),
    query: () => fc.constantFrom("variant=thumb", "variant=full", "", "variant=../../etc", "variant=thumb&variant=full"),
  }),
  "DELETE /api/inspections/[inspectionId]/photos/[photoId]": fuzzCase({
    as: "engineer",
    setup,
    params: (fx) => fc.tuple(inspectionParam(fx.draft.id, fx), fc.constantFrom(String(fx.photoId), String(fx.photoId + 1), "1")).map(([p, photoId]) => ({ ...p, photoId })),
  }),
};
