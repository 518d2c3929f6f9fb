"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import { ApiError, apiJson, NetworkError } from "@/lib/inspections/api-client";
import type { ContextProfile } from "@/lib/inspections/context";
import { fromDraft, randomToken, sameDraft, toDraft, type FormState } from "@/lib/inspections/form";
import type { InspectionDto } from "@/lib/inspections/schemas";

/** The validator (zod) loads after the sheet, not with it: the first save waits for it, once. */
const loadSchemas = () => import("@/lib/inspections/schemas");

/*
 * Keeps a draft safe: every change is written to this device at once (localStorage),
 * then saved to the server a moment later with the revision the device last had. No
 * network → "offline — kept on this device" and a retry when it returns. Another
 * device saved first → 409 with the server's copy, and the engineer chooses; nothing is
 * overwritten silently in either direction. Each save carries a fresh id, kept on the device
 * until its answer arrives: when an answer was lost (saved on the server, never heard here),
 * the 409 that follows names the device's own id, and the device carries on from there.
 */

export type SaveStatus =
  | { kind: "saved"; at: string | null }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "offline" }
  | { kind: "conflict"; message: string }
  | { kind: "refused"; message: string; field?: string };

/** `unacked`: ids of saves sent since `baseRevision` whose answer never arrived. */
type LocalRecord = { v: 1; baseRevision: number; form: FormState; dirty: boolean; at: string; unacked?: string[] };

const EDITABLE_STATES = ["draft", "returned"];
/** Unanswered save ids kept: far more than the attempts between two answers. */
const MAX_UNACKED = 50;

const SAVE_DELAY_MS = 1200;
const RETRY_MS = 10_000;

export const localKey = (id: number) => `kalibore:inspection:${id}`;

function readLocal(id: number): LocalRecord | null {
  try {
    const raw = localStorage.getItem(localKey(id));
    const rec = raw ? (JSON.parse(raw) as LocalRecord) : null;
    return rec?.v === 1 ? rec : null;
  } catch {
    return null;
  }
}

function writeLocal(id: number, rec: LocalRecord) {
  try {
    localStorage.setItem(localKey(id), JSON.stringify(rec));
  } catch {
    // Storage full or disabled: the server save still runs; nothing else to do here.
  }
}

export function useDraftAutosave(initial: InspectionDto, profile: ContextProfile) {
  const id = initial.id;
  const [form, setFormState] = useState<FormState>(() => fromDraft(initial.draft, profile));
  const [status, setStatus] = useState<SaveStatus>({ kind: "saved", at: initial.updatedAt });
  const [conflict, setConflict] = useState<InspectionDto | null>(null);
  const [invalid, setInvalid] = useState<string[]>([]);
  const [restored, setRestored] = useState(false);

  const formRef = useRef(form);
  const revisionRef = useRef(initial.revision);
  const fallbackRef = useRef(initial.draft.header);
  const editSeq = useRef(0);
  const dirtyRef = useRef(false);
  const inflight = useRef<Promise<boolean> | null>(null);
  const timer = useRef<number | null>(null);
  const blocked = useRef(false); // true while a conflict waits for the engineer's choice
  const unacked = useRef<string[]>([]);

  const persistLocal = useCallback(
    (dirty: boolean) =>
      writeLocal(id, { v: 1, baseRevision: revisionRef.current, form: formRef.current, dirty, at: new Date().toISOString(), unacked: unacked.current }),
    [id],
  );

  const save = useCallback(async (): Promise<boolean> => {
    // One save at a time: two PUTs with the same revision would conflict with each other.
    while (inflight.current) {
      await inflight.current.catch(() => false);
      if (!dirtyRef.current) return true;
    }
    if (blocked.current) return false;
    const run = (async () => {
      const seq = editSeq.current;
      const { draft, invalid: bad } = toDraft(formRef.current, profile, fallbackRef.current);
      setInvalid(bad);
      // The same schema the server parses with: a refusal here means a bug, not a typo.
      let schemas: Awaited<ReturnType<typeof loadSchemas>>;
      try {
        schemas = await loadSchemas();
      } catch {
        // The validator could not be fetched (no network before it ever loaded): the entries stay here.
        setStatus({ kind: "offline" });
        return false;
      }
      const { inspectionDraftSchema, describeIssues } = schemas;
      const parsed = inspectionDraftSchema.safeParse(draft);
      if (!parsed.success) {
        const d = describeIssues(parsed.error);
        setStatus({ kind: "refused", message: d.message, field: d.field });
        return false;
      }
      setStatus({ kind: "saving" });
      /** One PUT; its id is written down before it leaves, so a lost answer can be recognised later. */
      const put = async () => {
        const saveId = randomToken(24);
        unacked.current = [...unacked.current, saveId].slice(-MAX_UNACKED);
        persistLocal(dirtyRef.current);
        const res = await apiJson<{ revision: number }>(`/api/inspections/${id}`, { method: "PUT", body: { revision: revisionRef.current, draft: parsed.data, saveId } });
        unacked.current = [];
        return res;
      };
      try {
        let res: { revision: number };
        try {
          res = await put();
        } catch (err) {
          const server = err instanceof ApiError && err.status === 409 ? (err.body.details?.server as InspectionDto | undefined) : undefined;
          if (!server || !EDITABLE_STATES.includes(server.state) || !server.lastSaveId || !unacked.current.includes(server.lastSaveId)) throw err;
          // The server's newer revision is this device's own save whose answer was lost: carry on from it.
          revisionRef.current = server.revision;
          fallbackRef.current = server.draft.header;
          unacked.current = [];
          res = await put();
        }
        revisionRef.current = res.revision;
        fallbackRef.current = parsed.data.header;
        if (seq === editSeq.current) {
          dirtyRef.current = false;
          persistLocal(false);
          setStatus({ kind: "saved", at: new Date().toISOString() });
        } else {
          persistLocal(true);
          setStatus({ kind: "pending" });
        }
        return true;
      } catch (err) {
        if (err instanceof NetworkError || (err instanceof ApiError && [502, 503, 504].includes(err.status))) {
          // No network, or the server cannot reach its database: kept here, sent again on the next try.
          setStatus({ kind: "offline" });
        } else if (
          err instanceof ApiError &&
          err.status === 409 &&
          (err.body.details?.server as InspectionDto | undefined)?.state === "draft" &&
          sameDraft((err.body.details!.server as InspectionDto).draft, parsed.data)
        ) {
          // The server already holds exactly this (an earlier save whose answer was lost): take its revision.
          const server = err.body.details!.server as InspectionDto;
          revisionRef.current = server.revision;
          fallbackRef.current = server.draft.header;
          if (seq === editSeq.current) {
            dirtyRef.current = false;
            persistLocal(false);
            setStatus({ kind: "saved", at: server.updatedAt });
          } else {
            persistLocal(true);
            setStatus({ kind: "pending" });
          }
          return true;
        } else if (err instanceof ApiError && err.status === 409) {
          blocked.current = true;
          setConflict((err.body.details?.server as InspectionDto | undefined) ?? null);
          setStatus({ kind: "conflict", message: err.message });
        } else if (err instanceof ApiError && err.status === 401) {
          setStatus({ kind: "refused", message: "Your session has ended. Sign in again in another tab; everything is kept on this device." });
        } else if (err instanceof ApiError) {
          setStatus({ kind: "refused", message: err.message, field: err.body.details?.field });
        } else {
          setStatus({ kind: "offline" });
        }
        return false;
      }
    })();
    inflight.current = run;
    try {
      return await run;
    } finally {
      inflight.current = null;
    }
  }, [id, persistLocal, profile]);

  const schedule = useCallback(() => {
    if (timer.current) window.clearTimeout(timer.current);
    timer.current = window.setTimeout(() => {
      timer.current = null;
      void save();
    }, SAVE_DELAY_MS);
  }, [save]);

  const setForm = useCallback(
    (update: (f: FormState) => FormState) => {
      const next = update(formRef.current);
      formRef.current = next;
      editSeq.current += 1;
      dirtyRef.current = true;
      setFormState(next);
      persistLocal(true);
      if (!blocked.current) {
        setStatus((s) => (s.kind === "offline" ? s : { kind: "pending" }));
        schedule();
      }
    },
    [persistLocal, schedule],
  );

  // On opening: unsaved edits kept on this device win over the server copy they were based on;
  // if the server moved on meanwhile, that is a conflict for the engineer to settle. A page
  // opened with no network is this device's last copy of the page, which may be older than
  // what the device has saved since: then the device's copy, and its revision, stand.
  // Fetch the validator as soon as the sheet is up, while there is surely a network, so the
  // first save made offline finds it (the service worker keeps the chunk too).
  useEffect(() => {
    void loadSchemas().catch(() => undefined);
  }, []);

  useEffect(() => {
    const local = readLocal(id);
    unacked.current = local?.unacked ?? [];
    // The server's copy is this device's own save whose answer was lost: it is the base now.
    const ownSave = local !== null && local.baseRevision < initial.revision && !!initial.lastSaveId && unacked.current.includes(initial.lastSaveId);
    if (ownSave) {
      local.baseRevision = initial.revision;
      unacked.current = [];
    }
    const newerHere = local !== null && local.baseRevision > initial.revision;
    if (local && (local.dirty || newerHere)) {
      formRef.current = local.form;
      setFormState(local.form);
      if (newerHere) revisionRef.current = local.baseRevision;
      dirtyRef.current = local.dirty;
      setRestored(local.dirty);
      if (!local.dirty) {
        setStatus({ kind: "saved", at: local.at });
      } else if (local.baseRevision >= initial.revision) {
        void save();
      } else if (sameDraft(toDraft(local.form, profile, initial.draft.header).draft, initial.draft)) {
        // This device's own save reached the server but its answer was lost: nothing differs.
        dirtyRef.current = false;
        setRestored(false);
        persistLocal(false);
      } else {
        blocked.current = true;
        setConflict(initial);
        setStatus({ kind: "conflict", message: "This device holds changes that were not saved, and the draft on the server changed since. Choose which to keep." });
      }
    } else {
      persistLocal(false);
    }
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [id]);

  // Retry when the network returns, and now and then in case the browser does not say.
  useEffect(() => {
    const retry = () => {
      if (dirtyRef.current && !blocked.current) void save();
    };
    window.addEventListener("online", retry);
    const t = window.setInterval(retry, RETRY_MS);
    return () => {
      window.removeEventListener("online", retry);
      window.clearInterval(t);
    };
  }, [save]);

  /** Settle a conflict: keep what this device has (saved over the server's copy, knowingly) or take the server's. */
  const resolveConflict = useCallback(
    async (choice: "mine" | "theirs") => {
      const server = conflict;
      if (!server) return;
      revisionRef.current = server.revision;
      fallbackRef.current = server.draft.header;
      blocked.current = false;
      setConflict(null);
      if (choice === "theirs") {
        const f = fromDraft(server.draft, profile);
        formRef.current = f;
        setFormState(f);
        dirtyRef.current = false;
        persistLocal(false);
        setStatus({ kind: "saved", at: server.updatedAt });
      } else {
        dirtyRef.current = true;
        editSeq.current += 1;
        persistLocal(true);
        await save();
      }
    },
    [conflict, persistLocal, profile, save],
  );

  /** Save now and wait (before submitting). True when the server holds exactly what is on screen. */
  const flush = useCallback(async () => {
    if (timer.current) {
      window.clearTimeout(timer.current);
      timer.current = null;
    }
    if (dirtyRef.current) return save();
    if (inflight.current) return inflight.current;
    return !blocked.current;
  }, [save]);

  /** A step other than saving (a submit) found the server's copy newer: settle it like a save conflict. */
  const showConflict = useCallback((server: InspectionDto | null, message: string) => {
    blocked.current = true;
    setConflict(server);
    setStatus({ kind: "conflict", message });
  }, []);

  const forget = useCallback(() => {
    try {
      localStorage.removeItem(localKey(id));
    } catch {
      /* nothing kept */
    }
  }, [id]);

  return { form, setForm, status, conflict, resolveConflict, showConflict, invalid, flush, forget, restored, revision: () => revisionRef.current };
}
