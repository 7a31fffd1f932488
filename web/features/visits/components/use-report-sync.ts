import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import type { UseFormReturn } from 'react-hook-form';
import type { VisitDetail, VisitReportContent } from '@shared/schemas/visits';
import { ApiError } from '../../../lib/api-client';
import { applyServerIssues } from '../../../lib/form-issues';
import { forgetLocal, keepLocally, readLocal } from '../../../lib/offline-store';
import { visitKeys } from '../../../lib/query-keys';
import { getVisit } from '../api/get-visit';
import { saveReport } from '../api/save-report';
import { reportFieldFor, type ReportFormValues, type reportFormSchema } from '../utils/report-form';

/*
 * Never lose a technician's words: every change is kept on this phone at once (IndexedDB), and sent
 * to the server a moment after typing stops. Without a connection the phone copy waits and goes
 * when the browser is back online. Each save names the version it started from; if another device
 * saved in between, the server answers 409 and both versions are offered — nothing is overwritten
 * silently.
 */

export type SyncState =
  | { kind: 'saved'; at: number | null }
  | { kind: 'waiting' }
  | { kind: 'saving' }
  | { kind: 'offline' }
  | { kind: 'invalid' }
  | { kind: 'failed'; message: string }
  | { kind: 'conflict'; theirs: VisitDetail };

export interface LocalDraft {
  baseVersion: number;
  values: ReportFormValues;
  changedAt: string;
}

export const localDraftKey = (visitId: string) => `visit-draft:${visitId}`;

/** How long typing must pause before a save (common practice for autosave: one to two seconds). */
const saveAfterMs = 1500;
const retryAfterMs = 10_000;

type ReportForm = UseFormReturn<ReportFormValues, unknown, VisitReportContent>;

export function useReportSync({
  visit,
  form,
  schema,
  startVersion,
  startState,
}: {
  visit: VisitDetail;
  form: ReportForm;
  schema: ReturnType<typeof reportFormSchema>;
  startVersion: number;
  startState: SyncState;
}) {
  const queryClient = useQueryClient();
  const [state, setState] = useState<SyncState>(startState);
  const version = useRef(startVersion);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const inFlight = useRef<Promise<boolean> | null>(null);
  const changedSinceSave = useRef(startState.kind === 'waiting');
  const conflict = useRef(startState.kind === 'conflict');

  const keepOnPhone = useCallback(
    () =>
      keepLocally<LocalDraft>(localDraftKey(visit.id), {
        baseVersion: version.current,
        values: form.getValues(),
        changedAt: new Date().toISOString(),
      }),
    [form, visit.id],
  );

  const save = useCallback(async (): Promise<boolean> => {
    if (conflict.current) return false;
    if (inFlight.current) {
      await inFlight.current;
      if (!changedSinceSave.current) return true;
    }
    const run = (async () => {
      const parsed = schema.safeParse(form.getValues());
      if (!parsed.success) {
        await form.trigger();
        setState({ kind: 'invalid' });
        return false;
      }
      if (!navigator.onLine) {
        setState({ kind: 'offline' });
        return false;
      }
      changedSinceSave.current = false;
      setState({ kind: 'saving' });
      try {
        const saved = await saveReport(visit.id, { version: version.current, content: parsed.data });
        version.current = saved.version;
        queryClient.setQueryData(visitKeys.detail(visit.id), saved);
        if (changedSinceSave.current) {
          await keepOnPhone();
          setState({ kind: 'waiting' });
        } else {
          await forgetLocal(localDraftKey(visit.id));
          setState({ kind: 'saved', at: Date.now() });
        }
        return true;
      } catch (error) {
        changedSinceSave.current = true;
        if (!(error instanceof ApiError) || error.status === 0) {
          setState({ kind: 'offline' });
        } else if (error.status === 409) {
          conflict.current = true;
          const theirs = await getVisit(visit.id).catch(() => null);
          if (theirs) setState({ kind: 'conflict', theirs });
          else setState({ kind: 'failed', message: error.message });
        } else if (error.status === 400) {
          applyServerIssues(form, error, reportFieldFor);
          setState({ kind: 'invalid' });
        } else {
          setState({ kind: 'failed', message: error.message || 'The report could not be saved.' });
        }
        return false;
      }
    })();
    inFlight.current = run;
    try {
      return await run;
    } finally {
      inFlight.current = null;
    }
  }, [form, keepOnPhone, queryClient, schema, visit.id]);

  const schedule = useCallback(
    (afterMs: number) => {
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(() => void save(), afterMs);
    },
    [save],
  );

  // Every change: onto the phone now, to the server once typing pauses.
  useEffect(() => {
    const subscription = form.watch(() => {
      changedSinceSave.current = true;
      void keepOnPhone();
      if (conflict.current) return;
      setState((current) => (current.kind === 'offline' ? current : { kind: 'waiting' }));
      schedule(saveAfterMs);
    });
    return () => subscription.unsubscribe();
  }, [form, keepOnPhone, schedule]);

  // Back online: send what waited. A failed save is tried again after a pause.
  useEffect(() => {
    const online = () => {
      if (changedSinceSave.current) schedule(0);
    };
    window.addEventListener('online', online);
    return () => window.removeEventListener('online', online);
  }, [schedule]);
  useEffect(() => {
    if (state.kind === 'failed' || (state.kind === 'offline' && navigator.onLine)) schedule(retryAfterMs);
    if (state.kind === 'waiting' && !timer.current) schedule(saveAfterMs);
  }, [schedule, state.kind]);
  useEffect(
    () => () => {
      if (timer.current) clearTimeout(timer.current);
    },
    [],
  );

  /** Before publishing: whatever is typed is saved first; false when it could not be. */
  const flush = useCallback(async () => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    if (!changedSinceSave.current && state.kind !== 'invalid') return true;
    return save();
  }, [save, state.kind]);

  /** After a 409: keep this phone's text (saved over the other) or take the saved one. */
  const resolveConflict = useCallback(
    async (choice: 'mine' | 'theirs', theirs: VisitDetail, theirsValues: ReportFormValues) => {
      conflict.current = false;
      version.current = theirs.version;
      queryClient.setQueryData(visitKeys.detail(visit.id), theirs);
      if (choice === 'theirs') {
        form.reset(theirsValues);
        changedSinceSave.current = false;
        await forgetLocal(localDraftKey(visit.id));
        setState({ kind: 'saved', at: Date.now() });
        return;
      }
      changedSinceSave.current = true;
      await keepOnPhone();
      await save();
    },
    [form, keepOnPhone, queryClient, save, visit.id],
  );

  return { state, flush, resolveConflict, version };
}

/** What this phone kept of a report, if anything. */
export const readLocalDraft = (visitId: string) => readLocal<LocalDraft>(localDraftKey(visitId));
