import { useEffect, useRef, useState } from 'react';
import { useController, useWatch } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { formatMoney } from '@shared/billing/money';
import {
  defaultFirstAid,
  urgentCategories,
  urgentCategoryNames,
  type UrgentCategory,
} from '@shared/urgent/categories';
import { Button } from '../../../components/button';
import { Form, FormProblem, SubmitButton, useZodForm, type ZodForm } from '../../../components/form';
import { TextAreaField, TextField } from '../../../components/form-fields';
import { RadioGroup } from '../../../components/radio-group';
import { SectionCard } from '../../../components/section-card';
import { LoadingState } from '../../../components/states';
import { ApiError } from '../../../lib/api-client';
import { relativeTime } from '../../../lib/format';
import { forgetLocal, keepLocally, readLocal } from '../../../lib/offline-store';
import { useOnline } from '../../../lib/use-online';
import { useCreateUrgentRequest } from '../api/create-urgent-request';
import { useUrgentSettings } from '../api/get-urgent-settings';
import {
  emptyRequestForm,
  isBlankRequest,
  requestDraftKey,
  requestFieldFor,
  requestFormSchema,
  type RequestDraft,
  type RequestFormValues,
} from '../utils/request-form';
import { FirstAidPanel } from './first-aid-panel';
import { RequestEquipmentField } from './request-equipment-field';
import { RequestPhotosField } from './request-photos-field';
import { YesNoField } from './yes-no-field';

/** How long typing pauses before the copy on this device is rewritten. */
const keepAfterMs = 300;

/** How much of the first aid a choice brings on screen: its heading and the top of the cautions. */
const firstAidRevealPx = 200;

type RequestForm = ZodForm<typeof requestFormSchema>;

/** What the status page says on arrival from the form. */
export interface RequestSentNotice {
  notice: string;
}

/**
 * Keeps every change on this device (IndexedDB), so a lost connection, a reload or a closed tab
 * loses nothing; `stop` is called once the request is sent, before the copy is forgotten.
 */
function useKeepDraft(form: RequestForm, tankId: string) {
  const stopped = useRef(false);
  useEffect(() => {
    let timer: number | undefined;
    const subscription = form.watch(() => {
      window.clearTimeout(timer);
      timer = window.setTimeout(() => {
        if (stopped.current) return;
        const values = form.getValues();
        const key = requestDraftKey(tankId);
        // A browser that keeps nothing (private mode, full storage) still lets the request go.
        const kept = isBlankRequest(values)
          ? forgetLocal(key)
          : keepLocally<RequestDraft>(key, { values, savedAt: new Date().toISOString() });
        kept.catch(() => undefined);
      }, keepAfterMs);
    });
    return () => {
      window.clearTimeout(timer);
      subscription.unsubscribe();
    };
  }, [form, tankId]);
  return () => {
    stopped.current = true;
  };
}

/** `minor`: the fee in the currency's minor unit (cents, pence; whole yen). */
function CallOutFee({ minor, currency }: { minor: number; currency: string }) {
  return (
    <div className="rounded-lg border-2 border-ink-800 bg-sand-100 p-4">
      <p className="text-lg font-bold text-ink-900">Call-out fee: {formatMoney(minor, currency)}</p>
      <p className="mt-1 text-ink-900">The call-out fee is charged once a technician comes out.</p>
    </div>
  );
}

/**
 * On a phone the first aid appears under six tiles, below the first screen: when the owner picks a
 * category, the page moves just far enough to show its heading and the first cautions, which keeps
 * the chosen tile (and the focus on it) in view. A choice restored from the draft moves nothing.
 */
function useRevealFirstAid(chosen: UrgentCategory | null) {
  const panelRef = useRef<HTMLDivElement>(null);
  const shownFor = useRef(chosen);
  useEffect(() => {
    if (chosen === shownFor.current) return;
    shownFor.current = chosen;
    const panel = panelRef.current;
    if (!chosen || !panel) return;
    const below = panel.getBoundingClientRect().top + firstAidRevealPx - window.innerHeight;
    if (below <= 0) return;
    const still = window.matchMedia('(prefers-reduced-motion: reduce)').matches;
    window.scrollBy({ top: below, behavior: still ? 'auto' : 'smooth' });
  }, [chosen]);
  return panelRef;
}

/** The categories as large tiles; the card's heading already asks the question, so the legend is for screen readers. */
function CategoryField({ control }: { control: RequestForm['control'] }) {
  const { field, fieldState } = useController({ control, name: 'category' });
  return (
    <RadioGroup<UrgentCategory>
      legend="What is happening"
      hideLegend
      look="tiles"
      name={field.name}
      value={urgentCategories.includes(field.value) ? field.value : undefined}
      onChange={field.onChange}
      error={fieldState.error?.message}
      className="[&>div]:grid [&>div]:grid-cols-1 sm:[&>div]:grid-cols-2 lg:[&>div]:grid-cols-3"
      options={urgentCategories.map((value) => ({
        value,
        label: (
          <span className="flex flex-col py-1 text-left">
            <span>{urgentCategoryNames[value].label}</span>
            <span className="text-sm font-normal">{urgentCategoryNames[value].hint}</span>
          </span>
        ),
      }))}
    />
  );
}

function RequestFields({
  tankId,
  forOwners,
  form,
  draftSavedAt,
  onStartAgain,
}: {
  tankId: string;
  forOwners: boolean;
  form: RequestForm;
  draftSavedAt: string | null;
  onStartAgain: () => void;
}) {
  const settings = useUrgentSettings();
  const online = useOnline();
  const category = useWatch({ control: form.control, name: 'category' });
  const chosen = urgentCategories.includes(category) ? category : null;
  const powerBoardHref = `/tanks/${tankId}?section=equipment`;
  // The company's own text when it has loaded; the common-practice defaults until then, or offline.
  const firstAid = chosen ? (settings.data?.firstAid[chosen] ?? defaultFirstAid[chosen]) : null;
  const fee = settings.data?.callOutFeeCents ?? null;
  const firstAidRef = useRevealFirstAid(chosen);
  return (
    <>
      {draftSavedAt && (
        <div
          role="status"
          className="flex flex-col gap-2 rounded-card bg-brine-100 p-4 text-ink-950 sm:flex-row sm:items-center sm:justify-between"
        >
          <p>
            <span className="font-bold">We kept what you typed on this device</span> (
            {relativeTime(draftSavedAt)}). It has not been sent yet.
          </p>
          <Button tone="secondary" className="self-start sm:self-auto" onClick={onStartAgain}>
            Start again
          </Button>
        </div>
      )}
      <SectionCard
        title="What is happening?"
        hint="Choose one: first-aid steps appear at once, before anything is sent."
      >
        <CategoryField control={form.control} />
      </SectionCard>
      <p aria-live="polite" className="sr-only">
        {chosen ? `First-aid steps for ${urgentCategoryNames[chosen].label} are shown below.` : ''}
      </p>
      {chosen && firstAid && (
        <div ref={firstAidRef} className="min-w-0">
          <FirstAidPanel category={chosen} firstAid={firstAid} powerBoardHref={powerBoardHref} />
        </div>
      )}
      <SectionCard title="Tell us more">
        {chosen === 'equipment' && <RequestEquipmentField tankId={tankId} powerBoardHref={powerBoardHref} />}
        <TextAreaField<RequestFormValues>
          name="description"
          label="What do you see?"
          hint="What happened, since when, and what you have done so far."
          rows={4}
          maxLength={4000}
          required
        />
        <RequestPhotosField tankId={tankId} />
      </SectionCard>
      <SectionCard title={forOwners ? 'Reaching the owner and the tank' : 'Reaching you and the tank'}>
        <YesNoField<RequestFormValues> name="someoneOnSite" label="Is someone with the tank now?" />
        <TextAreaField<RequestFormValues>
          name="access"
          label="How to get in (optional)"
          hint="Keys, door codes, a neighbour, where to park."
          rows={2}
          maxLength={1000}
        />
        <TextField<RequestFormValues>
          name="phone"
          label={forOwners ? "The owner's phone number" : 'Phone number'}
          hint="With country code, e.g. +44 20 7946 0958"
          type="tel"
          autoComplete="tel"
          inputMode="tel"
          maxLength={40}
          className="sm:max-w-sm"
        />
        <TextField<RequestFormValues>
          name="bestTime"
          label={forOwners ? 'Best time to reach them (optional)' : 'Best time to reach you (optional)'}
          hint="For example: any time, or after 17:00."
          maxLength={200}
          className="sm:max-w-md"
        />
      </SectionCard>
      <div className="grid gap-3">
        {fee !== null && fee > 0 && settings.data && (
          <CallOutFee minor={fee} currency={settings.data.currency} />
        )}
        {!online && (
          <p className="rounded-lg bg-watch-100 p-3 font-bold text-watch-700">
            You are offline. What you typed is kept on this device; send it when you are back online.
          </p>
        )}
        <FormProblem />
        <SubmitButton pending="Sending…" className="w-full text-lg sm:w-auto sm:justify-self-end">
          Send the urgent request
        </SubmitButton>
      </div>
    </>
  );
}

function RequestFormBody({
  tankId,
  draft,
  forOwners,
}: {
  tankId: string;
  draft: RequestDraft | null;
  forOwners: boolean;
}) {
  const navigate = useNavigate();
  const settings = useUrgentSettings();
  const create = useCreateUrgentRequest(tankId);
  const [draftSavedAt, setDraftSavedAt] = useState(draft?.savedAt ?? null);
  const form = useZodForm(requestFormSchema, { defaultValues: draft?.values ?? emptyRequestForm() });
  const stopKeeping = useKeepDraft(form, tankId);
  return (
    <Form
      form={form}
      aria-label="Request an urgent visit"
      className="grid grid-cols-[minmax(0,1fr)] gap-4"
      fieldFor={requestFieldFor}
      onSubmit={async (request) => {
        try {
          const created = await create.mutateAsync({
            ...request,
            acceptedCallOutFeeCents: settings.data?.callOutFeeCents ?? null,
          });
          stopKeeping();
          await forgetLocal(requestDraftKey(tankId)).catch(() => undefined);
          void navigate(`/urgent/${created.id}`, {
            state: {
              notice:
                'Your request is sent. The technician on call is told now; this page updates by itself.',
            } satisfies RequestSentNotice,
          });
        } catch (error) {
          if (error instanceof ApiError && error.status === 409 && error.code === 'fee_changed') {
            const fresh = await settings.refetch();
            const now = fresh.data?.callOutFeeCents ?? null;
            form.setError('root.server', {
              type: 'server',
              message:
                now === null || now === 0
                  ? 'The call-out fee has changed: there is no call-out fee now. Send again to go ahead.'
                  : `The call-out fee has changed to ${formatMoney(now, fresh.data!.currency)}. Check it and send again to go ahead.`,
            });
            return;
          }
          throw error;
        }
      }}
    >
      <RequestFields
        tankId={tankId}
        forOwners={forOwners}
        form={form}
        draftSavedAt={draftSavedAt}
        onStartAgain={() => {
          form.reset(emptyRequestForm());
          setDraftSavedAt(null);
          void forgetLocal(requestDraftKey(tankId)).catch(() => undefined);
        }}
      />
    </Form>
  );
}

/**
 * Asking for an urgent visit: what is happening (first aid shows at once), the details, how to
 * reach the owner and the tank, and the call-out fee before sending. Opens with whatever was typed
 * here before and not sent.
 */
export function UrgentRequestForm({
  tankId,
  forOwners = false,
}: {
  tankId: string;
  /** Staff asking for the tank's owners (a request that came by phone): the contact is theirs. */
  forOwners?: boolean;
}) {
  const [draft, setDraft] = useState<{ tankId: string; draft: RequestDraft | null } | null>(null);
  useEffect(() => {
    let current = true;
    readLocal<RequestDraft>(requestDraftKey(tankId))
      .catch(() => undefined)
      .then((kept) => {
        if (current) setDraft({ tankId, draft: kept && !isBlankRequest(kept.values) ? kept : null });
      });
    return () => {
      current = false;
    };
  }, [tankId]);
  if (draft?.tankId !== tankId) return <LoadingState label="Opening the form…" />;
  return <RequestFormBody key={tankId} tankId={tankId} draft={draft.draft} forOwners={forOwners} />;
}
