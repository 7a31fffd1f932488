import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import { maxMessagePhotos, messageInput, type MessageView } from '@shared/schemas/conversations';
import { photoUrls } from '@shared/photos/urls';
import type { ZodForm } from '../../../components/form';
import { ApiError } from '../../../lib/api-client';
import { applyServerIssues } from '../../../lib/form-issues';
import { problemMessage } from '../../../lib/problem-message';
import { forgetLocal, keepLocally, readLocal } from '../../../lib/offline-store';
import { sendMessage, showSentMessage, uploadMessagePhoto } from '../api/send-message';

/*
 * Never lose what someone wrote: the draft (text, the note tick, photos — uploaded or still waiting
 * as files) is kept in this browser at every change and comes back with the page. Send waits for
 * its photos and for a connection, and goes by itself when both are there. The draft carries one
 * idempotency key from its first word until the server confirms it, so however often a send is
 * retried the message is stored once; only that confirmation clears the draft.
 */

type ComposerForm = ZodForm<typeof messageInput>;

export interface ComposerPhoto {
  key: string;
  photoId: string | null;
  /** The file while it is not uploaded yet; kept with the draft so it survives a reload. */
  file: Blob | null;
  previewUrl: string;
  state: 'uploading' | 'waiting' | 'failed' | 'ready';
  problem: string | null;
}

export interface MessageDraft {
  body: string;
  internal: boolean;
  photos: { key: string; photoId: string | null; file: Blob | null }[];
  idempotencyKey: string;
  /** Send was pressed and the server has not confirmed the message yet. */
  sending: boolean;
  changedAt: string;
}

export type SendState =
  | { kind: 'idle' }
  | { kind: 'sending' }
  /** Will go by itself: when the connection is back, or when the photos have uploaded. */
  | { kind: 'queued'; reason: 'offline' | 'photos' }
  | { kind: 'sent'; notice: string };

/** One draft per person and tank: a shared computer never shows one person's words to another. */
export const draftKey = (personId: string, tankId: string) => `message-draft:${personId}:${tankId}`;

export const readDraft = (personId: string, tankId: string) =>
  readLocal<MessageDraft>(draftKey(personId, tankId));

const maxBytes = 10 * 1024 * 1024;
/** A send that could not reach the server is tried again this often while the browser says it is online. */
const retryAfterMs = 15_000;

/** The server says how long to wait; the draft stays either way. */
const tooFast = (error: ApiError) =>
  `You are sending messages too fast. ${error.message || 'Wait a moment, then send again.'} Your message is still here.`;

function photoProblem(error: unknown): string {
  if (!(error instanceof ApiError)) return 'This photo could not be sent.';
  if (error.status === 413) return 'This photo is larger than 10 MB.';
  if (error.status === 415) return error.message || 'Choose a JPEG, PNG or WebP photo.';
  return error.message || 'This photo could not be saved.';
}

const isOffline = (error: unknown) => !(error instanceof ApiError) || error.status === 0;

function restoredPhotos(draft: MessageDraft | null): ComposerPhoto[] {
  return (draft?.photos ?? []).flatMap((kept): ComposerPhoto[] => {
    if (kept.photoId)
      return [
        {
          key: kept.key,
          photoId: kept.photoId,
          file: null,
          previewUrl: photoUrls(kept.photoId).thumbnailUrl,
          state: 'ready',
          problem: null,
        },
      ];
    if (!kept.file) return [];
    return [
      {
        key: kept.key,
        photoId: null,
        file: kept.file,
        previewUrl: URL.createObjectURL(kept.file),
        state: 'waiting',
        problem: null,
      },
    ];
  });
}

export function useMessageDraft({
  tankId,
  storageKey,
  form,
  draft,
  canWriteNotes,
  urgentRequestId = null,
  onSent,
}: {
  tankId: string;
  /** Lines written beside an urgent visit request are about it. */
  urgentRequestId?: string | null;
  /** Where the draft is kept (`draftKey`). */
  storageKey: string;
  form: ComposerForm;
  draft: MessageDraft | null;
  canWriteNotes: boolean;
  onSent: (message: MessageView) => void;
}) {
  const queryClient = useQueryClient();
  const [photos, setPhotosState] = useState<ComposerPhoto[]>(() => restoredPhotos(draft));
  const photosRef = useRef(photos);
  const [sendState, setSendState] = useState<SendState>(() =>
    draft?.sending ? { kind: 'queued', reason: 'offline' } : { kind: 'idle' },
  );
  const idempotencyKey = useRef(draft?.idempotencyKey ?? crypto.randomUUID());
  const wantSend = useRef(draft?.sending ?? false);
  const inFlight = useRef(false);
  const uploading = useRef(new Set<string>());

  const keep = useCallback(async () => {
    const { body, internal } = form.getValues();
    const kept = photosRef.current;
    if (body.trim() === '' && kept.length === 0 && !wantSend.current) {
      await forgetLocal(storageKey);
      return;
    }
    await keepLocally<MessageDraft>(storageKey, {
      body,
      internal: internal ?? false,
      photos: kept.map(({ key, photoId, file }) => ({ key, photoId, file })),
      idempotencyKey: idempotencyKey.current,
      sending: wantSend.current,
      changedAt: new Date().toISOString(),
    });
  }, [form, storageKey]);

  const setPhotos = useCallback(
    (change: (list: ComposerPhoto[]) => ComposerPhoto[]) => {
      photosRef.current = change(photosRef.current);
      setPhotosState(photosRef.current);
      form.setValue(
        'photoIds',
        photosRef.current.flatMap((photo) => (photo.photoId ? [photo.photoId] : [])),
      );
      void keep();
    },
    [form, keep],
  );

  const send = useCallback(async (): Promise<void> => {
    if (!wantSend.current || inFlight.current) return;
    const current = photosRef.current;
    if (current.some((photo) => photo.state === 'failed')) {
      wantSend.current = false;
      setSendState({ kind: 'idle' });
      form.setError('photoIds', {
        type: 'client',
        message: 'One photo could not be uploaded: remove it, or add it again.',
      });
      void keep();
      return;
    }
    if (!navigator.onLine || current.some((photo) => photo.state !== 'ready')) {
      setSendState({ kind: 'queued', reason: navigator.onLine ? 'photos' : 'offline' });
      void keep();
      return;
    }
    const values = form.getValues();
    const parsed = messageInput.safeParse({
      body: values.body,
      internal: canWriteNotes && (values.internal ?? false),
      photoIds: current.flatMap((photo) => (photo.photoId ? [photo.photoId] : [])),
      urgentRequestId,
    });
    if (!parsed.success) {
      wantSend.current = false;
      setSendState({ kind: 'idle' });
      void keep();
      await form.trigger();
      return;
    }
    inFlight.current = true;
    setSendState({ kind: 'sending' });
    try {
      const message = await sendMessage(tankId, parsed.data, idempotencyKey.current);
      wantSend.current = false;
      idempotencyKey.current = crypto.randomUUID();
      showSentMessage(queryClient, tankId, message);
      if (message.body !== parsed.data.body) {
        // The first try had reached the server before the connection dropped; the text was changed
        // since. That earlier version is the one sent (with its photos): the changes stay here, as
        // a new draft.
        const sentPhotos = new Set(message.photos.map((photo) => photo.id));
        setPhotos((list) => list.filter((photo) => !photo.photoId || !sentPhotos.has(photo.photoId)));
        setSendState({
          kind: 'sent',
          notice: 'Your earlier version was already sent. Your changes are still here to send.',
        });
      } else {
        for (const photo of photosRef.current) if (photo.file) URL.revokeObjectURL(photo.previewUrl);
        photosRef.current = [];
        setPhotosState([]);
        form.reset({ body: '', internal: false, photoIds: [] });
        await forgetLocal(storageKey);
        setSendState({
          kind: 'sent',
          notice: message.kind === 'internal-note' ? 'Note added.' : 'Message sent.',
        });
      }
      onSent(message);
    } catch (error) {
      if (isOffline(error)) {
        setSendState({ kind: 'queued', reason: 'offline' });
        void keep();
        return;
      }
      wantSend.current = false;
      setSendState({ kind: 'idle' });
      void keep();
      if (error instanceof ApiError && error.status === 429) {
        form.setError('root.server', { type: 'server', message: tooFast(error) });
      } else if (error instanceof ApiError && error.status === 400) {
        applyServerIssues(form, error);
      } else {
        form.setError('root.server', { type: 'server', message: problemMessage(error) });
      }
    } finally {
      inFlight.current = false;
    }
  }, [canWriteNotes, form, keep, onSent, queryClient, setPhotos, storageKey, tankId, urgentRequestId]);

  const upload = useCallback(
    async (key: string) => {
      const photo = photosRef.current.find((p) => p.key === key);
      if (!photo?.file || uploading.current.has(key)) return;
      uploading.current.add(key);
      const update = (patch: Partial<ComposerPhoto>) =>
        setPhotos((list) => list.map((p) => (p.key === key ? { ...p, ...patch } : p)));
      try {
        if (!navigator.onLine) throw new ApiError(0, 'network_error', 'offline');
        update({ state: 'uploading', problem: null });
        const saved = await uploadMessagePhoto(tankId, photo.file);
        URL.revokeObjectURL(photo.previewUrl);
        update({ photoId: saved.id, file: null, previewUrl: saved.thumbnailUrl, state: 'ready' });
      } catch (error) {
        update(isOffline(error) ? { state: 'waiting' } : { state: 'failed', problem: photoProblem(error) });
      } finally {
        uploading.current.delete(key);
      }
      // A send that waited for this photo goes now.
      void send();
    },
    [send, setPhotos, tankId],
  );

  /** Files chosen in the picker: kept at once, uploaded straight away (or when back online). */
  const addFiles = useCallback(
    (files: readonly File[]): string | null => {
      const room = maxMessagePhotos - photosRef.current.length;
      const fitting = files.filter((file) => file.size <= maxBytes);
      const taken = fitting.slice(0, Math.max(0, room));
      const added = taken.map((file): ComposerPhoto => ({
        key: crypto.randomUUID(),
        photoId: null,
        file,
        previewUrl: URL.createObjectURL(file),
        state: 'waiting',
        problem: null,
      }));
      if (added.length > 0) {
        form.clearErrors('photoIds');
        setPhotos((list) => [...list, ...added]);
        for (const photo of added) void upload(photo.key);
      }
      if (fitting.length < files.length) return 'A photo larger than 10 MB was left out.';
      if (taken.length < fitting.length) return `A message takes at most ${maxMessagePhotos} photos.`;
      return null;
    },
    [form, setPhotos, upload],
  );

  const removePhoto = useCallback(
    (key: string) => {
      const photo = photosRef.current.find((p) => p.key === key);
      if (photo?.file) URL.revokeObjectURL(photo.previewUrl);
      form.clearErrors('photoIds');
      setPhotos((list) => list.filter((p) => p.key !== key));
    },
    [form, setPhotos],
  );

  /** Send pressed (the form already checked the text): goes now, or as soon as it can. */
  const requestSend = useCallback(async () => {
    wantSend.current = true;
    form.clearErrors('root.server');
    await send();
  }, [form, send]);

  /** Keeps the message here instead of sending it when the connection is back. */
  const holdBack = useCallback(() => {
    wantSend.current = false;
    setSendState({ kind: 'idle' });
    void keep();
  }, [keep]);

  // Every change to the text or the tick is kept in this browser at once.
  useEffect(() => {
    const subscription = form.watch((_values, { name }) => {
      if (name !== 'photoIds') void keep();
    });
    return () => subscription.unsubscribe();
  }, [form, keep]);

  // Photos kept from an earlier visit upload now; a send that was waiting goes once they have.
  useEffect(() => {
    const waiting = photosRef.current.filter((photo) => photo.state === 'waiting');
    for (const photo of waiting) void upload(photo.key);
    if (waiting.length === 0) void send();
  }, [send, upload]);

  useEffect(() => {
    const online = () => {
      const waiting = photosRef.current.filter((p) => p.state === 'waiting');
      for (const photo of waiting) void upload(photo.key);
      if (waiting.length === 0) void send();
    };
    window.addEventListener('online', online);
    return () => window.removeEventListener('online', online);
  }, [send, upload]);

  // The browser can believe it is online while Brinewatch cannot be reached: try again now and then.
  const queuedOffline = sendState.kind === 'queued' && sendState.reason === 'offline';
  useEffect(() => {
    if (!queuedOffline) return;
    const timer = window.setInterval(() => {
      if (navigator.onLine) void send();
    }, retryAfterMs);
    return () => window.clearInterval(timer);
  }, [queuedOffline, send]);

  return { photos, sendState, addFiles, removePhoto, requestSend, holdBack };
}
