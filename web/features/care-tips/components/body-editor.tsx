import { useId, useState } from 'react';
import { useFormContext, useFormState, useWatch } from 'react-hook-form';
import { maxTipBodyLength } from '@shared/schemas/care-tips';
import { TextAreaField } from '../../../components/form-fields';
import { Markdown } from '../../../components/markdown';
import { RadioGroup } from '../../../components/radio-group';
import { TipCategoryBadge } from '../../../components/tip-badges';
import type { TipFormValues } from '../utils/tip-form';

type View = 'write' | 'preview';

/** Inline, as it sits in the field's hint line. */
function MarkdownHelp() {
  const code = 'rounded bg-ink-100 px-1 font-mono text-[0.85em] text-ink-950';
  return (
    <>
      <span className="block">
        Markdown: <code className={code}>**bold**</code>, <code className={code}>*italic*</code>, a line
        starting <code className={code}>- </code> for a list, <code className={code}>[words](https://…)</code>{' '}
        for a link.
      </span>
      <span className="mt-1 block">
        For safety advice (power near water, stinging or toxic livestock, chemicals), put it in a caution box:
        a line <code className={code}>::: caution</code>, the advice, then a line{' '}
        <code className={code}>:::</code>.
      </span>
    </>
  );
}

/** The tip as an owner will read it, from the same renderer the feed uses. */
function Preview() {
  const [title, body, category] = useWatch<TipFormValues, ['title', 'body', 'category']>({
    name: ['title', 'body', 'category'],
  });
  return (
    <article className="min-h-48 rounded-lg border-2 border-dashed border-ink-300 bg-white p-4">
      <div className="flex flex-wrap items-center gap-2">
        {category && <TipCategoryBadge category={category} />}
      </div>
      <p className="mt-2 text-lg font-bold text-ink-900">{title.trim() || 'Your title'}</p>
      {body.trim() === '' ? (
        <p className="mt-2 text-ink-700">Nothing to preview yet. Write the tip to see it here.</p>
      ) : (
        <Markdown source={body} className="mt-2" />
      )}
    </article>
  );
}

/**
 * The tip's text in Markdown beside its live preview on a desktop; on a phone, one at a time
 * behind "Write" and "Preview".
 */
export function BodyEditor() {
  const id = useId();
  const [view, setView] = useState<View>('write');
  const { errors } = useFormState<TipFormValues>({ name: 'body' });
  const { setFocus } = useFormContext<TipFormValues>();
  const refused = errors.body !== undefined;
  // A refused text is shown where it can be fixed (state adjusted while rendering, not in an effect).
  const [wasRefused, setWasRefused] = useState(refused);
  if (refused !== wasRefused) {
    setWasRefused(refused);
    if (refused) setView('write');
  }
  return (
    <div className="grid gap-3">
      <RadioGroup<View>
        legend="Show"
        hideLegend
        look="compact"
        className="lg:hidden"
        value={view}
        onChange={(next) => {
          setView(next);
          if (next === 'write') window.setTimeout(() => setFocus('body'), 0);
        }}
        options={[
          { value: 'write', label: 'Write' },
          { value: 'preview', label: 'Preview' },
        ]}
      />
      <div className="grid gap-4 lg:grid-cols-2">
        <div className={view === 'write' ? 'min-w-0' : 'hidden min-w-0 lg:block'}>
          <TextAreaField<TipFormValues>
            name="body"
            label="Text"
            hint={<MarkdownHelp />}
            rows={14}
            maxLength={maxTipBodyLength}
            required
          />
        </div>
        <section
          aria-labelledby={`${id}-preview`}
          className={view === 'preview' ? 'min-w-0' : 'hidden min-w-0 lg:block'}
        >
          <h3 id={`${id}-preview`} className="font-bold text-ink-900">
            Preview
          </h3>
          <p className="mt-0.5 mb-1 text-sm text-ink-700">As the owners will read it.</p>
          <Preview />
        </section>
      </div>
    </div>
  );
}
