import { useCallback, useEffect, useId, useState } from 'react';
import { useController, useFormContext, useWatch } from 'react-hook-form';
import {
  maxMessageLength,
  maxMessagePhotos,
  messageInput,
  type MessageInput,
  type MessageView,
} from '@shared/schemas/conversations';
import { Button } from '../../../components/button';
import { Form, FormProblem, useZodForm } from '../../../components/form';
import { FieldError } from '../../../components/field-error';
import { CheckboxField } from '../../../components/form-fields';
import { formatCount } from '../../../lib/format';
import {
  draftKey,
  readDraft,
  useMessageDraft,
  type ComposerPhoto,
  type MessageDraft,
  type SendState,
} from './use-message-draft';

/** The counter shows once this few characters are left (common practice: only when it matters). */
const counterFrom = 500;

/** The text box: grows with the text; Ctrl+Enter (⌘+Enter) sends, Enter starts a new line. */
function BodyField({ label, placeholder }: { label: string; placeholder: string }) {
  const id = useId();
  const { control } = useFormContext<MessageInput>();
  const { field, fieldState } = useController({ name: 'body', control });
  const { ref, value, onChange, onBlur, name } = field;
  const error = fieldState.error?.message;
  const length = value.length;
  const left = maxMessageLength - length;
  const showCounter = left <= counterFrom;
  const described = [showCounter ? `${id}-count` : null, error ? `${id}-error` : null]
    .filter(Boolean)
    .join(' ');
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block font-bold text-ink-900">
        {label}
      </label>
      <textarea
        id={id}
        ref={ref}
        name={name}
        value={value}
        onChange={(event) => onChange(event.target.value)}
        onBlur={onBlur}
        onKeyDown={(event) => {
          if (event.key === 'Enter' && (event.ctrlKey || event.metaKey)) {
            event.preventDefault();
            event.currentTarget.form?.requestSubmit();
          }
        }}
        rows={2}
        placeholder={placeholder}
        aria-invalid={error ? true : undefined}
        aria-describedby={described || undefined}
        className={`mt-1 block max-h-64 min-h-20 w-full min-w-0 rounded-lg border-2 bg-white px-3 py-2 text-base text-ink-950 field-sizing-content ${
          error || left < 0 ? 'border-alert-700' : 'border-ink-300 focus:border-ink-700'
        }`}
      />
      {showCounter && (
        <p
          id={`${id}-count`}
          className={`mt-1 text-sm ${left < 0 ? 'font-bold text-alert-700' : 'text-ink-700'}`}
        >
          {left < 0
            ? `${formatCount(-left)} characters too many (at most ${formatCount(maxMessageLength)})`
            : `${formatCount(left)} characters left`}
        </p>
      )}
      {error && (
        <FieldError id={`${id}-error`} className="mt-1">
          {error}
        </FieldError>
      )}
    </div>
  );
}

const photoStateWords: Record<ComposerPhoto['state'], string> = {
  uploading: 'Uploading…',
  waiting: 'Kept here; uploads when online',
  failed: 'Not uploaded',
  ready: 'Ready',
};

/** The photos chosen for this message, each with where it stands and a way to take it out again. */
function PhotoStrip({ photos, onRemove }: { photos: ComposerPhoto[]; onRemove: (key: string) => void }) {
  if (photos.length === 0) return null;
  return (
    <ul className="flex flex-wrap gap-2" aria-label="Photos to send">
      {photos.map((photo, index) => (
        <li key={photo.key} className="w-24 overflow-hidden rounded-lg border border-ink-300 bg-white">
          <img
            src={photo.previewUrl}
            alt={`Attachment ${index + 1} of ${photos.length}, to send`}
            className={`aspect-square w-full object-cover ${photo.state === 'ready' ? '' : 'opacity-70'}`}
          />
          <p
            className={`px-1 pt-1 text-xs ${photo.state === 'failed' ? 'font-bold text-alert-700' : 'text-ink-700'}`}
          >
            {photo.problem ?? photoStateWords[photo.state]}
          </p>
          <button
            type="button"
            onClick={() => onRemove(photo.key)}
            aria-label={`Remove attachment ${index + 1}`}
            className="min-h-11 w-full text-sm font-bold text-ink-900 hover:bg-ink-50"
          >
            Remove
          </button>
        </li>
      ))}
    </ul>
  );
}

/** The photo picker, drawn as a button; a refusal (too large, too many) is said through `onProblem`. */
function AddPhotosButton({
  count,
  onAdd,
  onProblem,
}: {
  count: number;
  onAdd: (files: File[]) => string | null;
  onProblem: (problem: string | null) => void;
}) {
  const id = useId();
  const full = count >= maxMessagePhotos;
  return (
    <>
      <label
        htmlFor={id}
        className={`inline-flex min-h-12 items-center justify-center gap-2 rounded-lg border-2 px-4 font-bold has-focus-visible:outline-3 has-focus-visible:outline-brine-500 ${
          full
            ? 'cursor-not-allowed border-ink-100 text-ink-500'
            : 'cursor-pointer border-ink-300 bg-white text-ink-900 hover:bg-ink-50'
        }`}
      >
        <CameraIcon />
        {count === 0 ? 'Add photos' : `Photos ${count} of ${maxMessagePhotos}`}
        <input
          id={id}
          type="file"
          multiple
          accept="image/jpeg,image/png,image/webp"
          disabled={full}
          aria-describedby={`${id}-hint`}
          className="sr-only"
          onChange={(event) => {
            onProblem(onAdd([...(event.target.files ?? [])]));
            event.target.value = '';
          }}
        />
      </label>
      <span id={`${id}-hint`} className="sr-only">
        Up to {maxMessagePhotos} photos: JPEG, PNG or WebP, 10 MB each.
      </span>
    </>
  );
}

function CameraIcon() {
  return (
    <svg viewBox="0 0 24 24" className="h-5 w-5 shrink-0" aria-hidden="true" focusable="false">
      <path
        d="M4 7.5h3l1.5-2h7l1.5 2h3a1 1 0 0 1 1 1V18a1 1 0 0 1-1 1H4a1 1 0 0 1-1-1V8.5a1 1 0 0 1 1-1Z"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinejoin="round"
      />
      <circle cx="12" cy="13" r="3.5" fill="none" stroke="currentColor" strokeWidth="1.8" />
    </svg>
  );
}

/** A photo problem: the picker's refusal, or the form's (from the schema or the server). */
function PhotoProblem({ picked }: { picked: string | null }) {
  const {
    formState: { errors },
  } = useFormContext<MessageInput>();
  const problem = errors.photoIds?.message ?? errors.photoIds?.root?.message ?? picked;
  return (
    <div role="alert" className="empty:hidden">
      {problem && <FieldError className="mt-0">{problem}</FieldError>}
    </div>
  );
}

function SendStatus({ state, onHoldBack }: { state: SendState; onHoldBack: () => void }) {
  return (
    <div role="status" className="text-sm">
      {state.kind === 'sending' && <p className="text-ink-700">Sending…</p>}
      {state.kind === 'queued' && state.reason === 'photos' && (
        <p className="text-ink-700">Sends as soon as the photos have uploaded…</p>
      )}
      {state.kind === 'queued' && state.reason === 'offline' && (
        <div className="flex flex-wrap items-center gap-2 rounded-lg bg-sand-100 p-2">
          <p className="font-bold text-ink-900">
            No connection. Your message is kept here and sends by itself when you are back online.
          </p>
          <Button tone="secondary" onClick={onHoldBack}>
            Don’t send yet
          </Button>
        </div>
      )}
      {state.kind === 'sent' && <p className="font-bold text-healthy-700">{state.notice}</p>}
    </div>
  );
}

function ComposerForm({
  tankId,
  personId,
  draft,
  canWriteNotes,
  recipients,
  urgentRequestId,
  onSent,
}: {
  tankId: string;
  urgentRequestId: string | undefined;
  personId: string;
  draft: MessageDraft | null;
  canWriteNotes: boolean;
  recipients: string;
  onSent: (message: MessageView) => void;
}) {
  const form = useZodForm(messageInput, {
    defaultValues: {
      body: draft?.body ?? '',
      internal: canWriteNotes && (draft?.internal ?? false),
      photoIds: (draft?.photos ?? []).flatMap((photo) => (photo.photoId ? [photo.photoId] : [])),
    },
  });
  const internal = useWatch({ control: form.control, name: 'internal' }) ?? false;
  const afterSend = useCallback(
    (message: MessageView) => {
      // Ready for the next line, where the thumb already is.
      form.setFocus('body');
      onSent(message);
    },
    [form, onSent],
  );
  const [pickProblem, setPickProblem] = useState<string | null>(null);
  const { photos, sendState, addFiles, removePhoto, requestSend, holdBack } = useMessageDraft({
    tankId,
    storageKey: draftKey(personId, tankId),
    form,
    draft,
    canWriteNotes,
    urgentRequestId,
    onSent: afterSend,
  });
  return (
    <Form
      form={form}
      aria-label={internal ? 'Write an internal note' : 'Write a message'}
      onSubmit={requestSend}
      className={`sticky bottom-0 z-10 grid gap-2 rounded-card p-3 shadow-card sm:gap-3 sm:p-4 ${
        internal ? 'border-2 border-dashed border-watch-700 bg-watch-100' : 'border border-ink-100 bg-white'
      }`}
    >
      <BodyField
        label={internal ? 'Internal note — staff only' : 'Message'}
        placeholder={internal ? 'Only staff see this note.' : `Write to ${recipients}…`}
      />
      <PhotoStrip photos={photos} onRemove={removePhoto} />
      <PhotoProblem picked={pickProblem} />
      {canWriteNotes && (
        <CheckboxField<MessageInput>
          name="internal"
          label="Internal note (staff only)"
          hint="Owners never see it."
        />
      )}
      <div className="flex items-center justify-between gap-2">
        <AddPhotosButton count={photos.length} onAdd={addFiles} onProblem={setPickProblem} />
        <Button
          type="submit"
          disabled={sendState.kind === 'sending'}
          className="min-h-12 min-w-28 px-6 text-lg"
        >
          {sendState.kind === 'sending' ? 'Sending…' : internal ? 'Add note' : 'Send'}
        </Button>
      </div>
      <FormProblem className="empty:hidden" />
      <SendStatus state={sendState} onHoldBack={holdBack} />
    </Form>
  );
}

/**
 * Writing to the conversation: the draft waits in this browser (and comes back after a reload)
 * until the server has the message.
 */
export function MessageComposer({
  tankId,
  personId,
  canWriteNotes,
  recipients,
  urgentRequestId,
  onSent,
}: {
  tankId: string;
  /** Set beside an urgent visit request: what is sent here is about it. */
  urgentRequestId?: string;
  /** The writer: drafts are kept per person. */
  personId: string;
  canWriteNotes: boolean;
  /** Whom a message goes to, for the placeholder: "Driftglass Aquatics", "Kim Ashdown". */
  recipients: string;
  onSent: (message: MessageView) => void;
}) {
  const [draft, setDraft] = useState<MessageDraft | null | undefined>(undefined);
  useEffect(() => {
    let live = true;
    readDraft(personId, tankId)
      .then((kept) => live && setDraft(kept ?? null))
      .catch(() => live && setDraft(null));
    return () => {
      live = false;
    };
  }, [personId, tankId]);
  if (draft === undefined) {
    return (
      <p role="status" className="rounded-card bg-white p-4 text-ink-700 shadow-card">
        Opening your draft…
      </p>
    );
  }
  return (
    <ComposerForm
      tankId={tankId}
      personId={personId}
      draft={draft}
      canWriteNotes={canWriteNotes}
      recipients={recipients}
      urgentRequestId={urgentRequestId}
      onSent={onSent}
    />
  );
}
