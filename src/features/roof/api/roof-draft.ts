/**
 * The roof being edited in this browser: one draft per job, shared by the Roof sketch and Layer stack
 * sections, kept in localStorage so a closed tab or a failed save loses nothing. The draft remembers
 * the server version it started from (`baseVersion`); saving sends that version, and the server answers
 * 409 when someone saved in between. Edits go through `update`, which keeps an undo history.
 */
import { useSyncExternalStore } from "react";
import type { RoofDto, Underlay } from "@shared/schemas/roof";
import type { TakeoffInputRaw } from "@shared/schemas/takeoff";

export type DraftPlane = TakeoffInputRaw["planes"][number];
export type DraftStack = TakeoffInputRaw["stacks"][number];

export interface RoofDoc {
  planes: DraftPlane[];
  stacks: DraftStack[];
  defaultStackId: string;
  underlay?: Underlay | null;
}

export interface RoofDraft {
  jobId: number;
  /** The server version this draft was started from (0: nothing saved yet). */
  baseVersion: number;
  doc: RoofDoc;
  /** True when the draft differs from what the server has at baseVersion. */
  dirty: boolean;
  past: RoofDoc[];
  future: RoofDoc[];
  /** ISO time of the last local change. */
  changedAt: string | null;
}

const HISTORY_LIMIT = 100;
const storageKey = (jobId: number) => `ridgewright:roof-draft:${jobId}`;

const drafts = new Map<number, RoofDraft>();
const listeners = new Map<number, Set<() => void>>();

function emit(jobId: number) {
  for (const l of listeners.get(jobId) ?? []) l();
}

function persist(d: RoofDraft) {
  try {
    if (d.dirty) {
      localStorage.setItem(
        storageKey(d.jobId),
        JSON.stringify({ baseVersion: d.baseVersion, doc: d.doc, changedAt: d.changedAt }),
      );
    } else {
      localStorage.removeItem(storageKey(d.jobId));
    }
  } catch {
    // storage full or disabled: the in-memory draft still works
  }
}

function set(d: RoofDraft) {
  drafts.set(d.jobId, d);
  persist(d);
  emit(d.jobId);
}

/** A draft saved in this browser by an earlier visit, if any. */
export function readStoredDraft(jobId: number): Pick<RoofDraft, "baseVersion" | "doc" | "changedAt"> | null {
  try {
    const raw = localStorage.getItem(storageKey(jobId));
    if (!raw) return null;
    const parsed = JSON.parse(raw) as { baseVersion?: unknown; doc?: RoofDoc; changedAt?: string | null };
    if (typeof parsed.baseVersion !== "number" || !parsed.doc || !Array.isArray(parsed.doc.planes)) return null;
    return { baseVersion: parsed.baseVersion, doc: parsed.doc, changedAt: parsed.changedAt ?? null };
  } catch {
    return null;
  }
}

export const docFromServer = (roof: RoofDto): RoofDoc => ({
  planes: roof.planes as DraftPlane[],
  stacks: roof.stacks as DraftStack[],
  defaultStackId: roof.defaultStackId,
  ...(roof.underlay ? { underlay: roof.underlay } : {}),
});

export const roofDraftStore = {
  get: (jobId: number): RoofDraft | undefined => drafts.get(jobId),

  subscribe(jobId: number, listener: () => void) {
    let set = listeners.get(jobId);
    if (!set) listeners.set(jobId, (set = new Set()));
    set.add(listener);
    return () => set!.delete(listener);
  },

  /**
   * Starts (or resumes) the draft for a job from the server's roof. A dirty draft in storage made from
   * the same server version is resumed; one made from an older version is kept aside as `stale`
   * for the screen to offer (the caller decides with `resumeStale` or `discardStale`).
   */
  load(roof: RoofDto & { jobId: number }): { resumed: boolean; stale: ReturnType<typeof readStoredDraft> } {
    const current = drafts.get(roof.jobId);
    if (current && current.baseVersion === roof.version) return { resumed: current.dirty, stale: null };
    const stored = readStoredDraft(roof.jobId);
    if (stored && stored.baseVersion === roof.version) {
      set({ jobId: roof.jobId, baseVersion: roof.version, doc: stored.doc, dirty: true, past: [], future: [], changedAt: stored.changedAt });
      return { resumed: true, stale: null };
    }
    if (current?.dirty) return { resumed: true, stale: { baseVersion: current.baseVersion, doc: current.doc, changedAt: current.changedAt } };
    set({ jobId: roof.jobId, baseVersion: roof.version, doc: docFromServer(roof), dirty: false, past: [], future: [], changedAt: null });
    return { resumed: false, stale: stored && stored.baseVersion !== roof.version ? stored : null };
  },

  /** Applies an edit; `coalesce` merges it into the previous history step (for drags). */
  update(jobId: number, edit: (doc: RoofDoc) => RoofDoc, opts: { coalesce?: boolean } = {}) {
    const d = drafts.get(jobId);
    if (!d) return;
    const next = edit(d.doc);
    if (next === d.doc) return;
    const past = opts.coalesce && d.past.length ? d.past : [...d.past, d.doc].slice(-HISTORY_LIMIT);
    set({ ...d, doc: next, dirty: true, past, future: [], changedAt: new Date().toISOString() });
  },

  undo(jobId: number) {
    const d = drafts.get(jobId);
    if (!d || !d.past.length) return;
    const prev = d.past[d.past.length - 1];
    set({ ...d, doc: prev, dirty: true, past: d.past.slice(0, -1), future: [d.doc, ...d.future], changedAt: new Date().toISOString() });
  },

  redo(jobId: number) {
    const d = drafts.get(jobId);
    if (!d || !d.future.length) return;
    const [next, ...rest] = d.future;
    set({ ...d, doc: next, dirty: true, past: [...d.past, d.doc], future: rest, changedAt: new Date().toISOString() });
  },

  /** After a successful save: the draft now matches the server at `version`. */
  markSaved(jobId: number, version: number, doc: RoofDoc) {
    const d = drafts.get(jobId);
    const changedSince = d && d.doc !== doc; // edits made while the save was in flight stay dirty
    set({
      jobId,
      baseVersion: version,
      doc: changedSince ? d!.doc : doc,
      dirty: Boolean(changedSince),
      past: d?.past ?? [],
      future: d?.future ?? [],
      changedAt: d?.changedAt ?? null,
    });
  },

  /** Keeps the local edits but builds on `version` (after the user chose to overwrite a newer save). */
  rebase(jobId: number, version: number) {
    const d = drafts.get(jobId);
    if (d) set({ ...d, baseVersion: version });
  },

  /** Throws the local edits away and takes the server's roof. */
  replaceWithServer(roof: RoofDto & { jobId: number }) {
    set({ jobId: roof.jobId, baseVersion: roof.version, doc: docFromServer(roof), dirty: false, past: [], future: [], changedAt: null });
  },

  /** For tests. */
  clearAll() {
    for (const id of [...drafts.keys()]) {
      drafts.delete(id);
      try {
        localStorage.removeItem(storageKey(id));
      } catch {
        /* ignore */
      }
    }
  },
};

/** The job's draft, re-rendering on every change. Undefined until `roofDraftStore.load` ran. */
export function useRoofDraft(jobId: number): RoofDraft | undefined {
  return useSyncExternalStore(
    (l) => roofDraftStore.subscribe(jobId, l),
    () => roofDraftStore.get(jobId),
  );
}
