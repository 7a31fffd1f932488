import { describe, expect, it } from 'vitest';
import { formatMoney } from '@shared/billing/money';
import { defaultFirstAid, urgentCategories } from '@shared/urgent/categories';
import {
  emptyRequestForm,
  isBlankRequest,
  requestFormSchema,
  type RequestFormValues,
} from '../../../../web/features/urgent/utils/request-form';
import {
  linesText,
  settingsFieldFor,
  settingsFormSchema,
  type SettingsFormValues,
} from '../../../../web/features/urgent/utils/settings-form';
import { formatAge, waitAgainstTarget } from '../../../../web/features/urgent/utils/urgent-text';
import { wallInstantText, wallText } from '../../../../web/features/urgent/utils/wall-clock';

const photoId = '3b0b6c9e-1f1a-4c55-9a3e-5f1f0c7a2d11';
const equipmentId = '8d5e1c2a-7b4f-4e0a-9c1d-2f3a4b5c6d7e';

const filled = (changes: Partial<RequestFormValues> = {}): RequestFormValues => ({
  ...emptyRequestForm(),
  category: 'leak',
  description: 'Water under the cabinet.',
  someoneOnSite: true,
  phone: '+44 20 7946 0958',
  ...changes,
});

describe('the new-request form', () => {
  it('asks for what is happening and whether someone is there, in plain words', () => {
    const result = requestFormSchema.safeParse(emptyRequestForm());
    const messages = Object.fromEntries(result.error!.issues.map((issue) => [issue.path[0], issue.message]));
    expect(messages.category).toBe('Choose what is happening.');
    expect(messages.someoneOnSite).toBe('Say whether someone is with the tank now.');
    expect(messages.description).toBe('Say what is happening.');
    expect(messages.phone).toBe('Enter a phone number with its country code, such as +44 20 7946 0958.');
  });

  it('sends the uploaded photos by id', () => {
    const request = requestFormSchema.parse(
      filled({ photos: [{ key: 'a', name: 'floor.jpg', id: photoId, thumbnailUrl: '/t', file: null }] }),
    );
    expect(request.photoIds).toEqual([photoId]);
    expect(request).not.toHaveProperty('photos');
  });

  it('waits for a photo still on the device instead of sending without it', () => {
    const result = requestFormSchema.safeParse(
      filled({
        photos: [{ key: 'a', name: 'floor.jpg', id: null, thumbnailUrl: null, file: new Blob(['x']) }],
      }),
    );
    expect(result.error!.issues[0]).toMatchObject({
      path: ['photos'],
      message: 'A photo is still waiting to upload. Send once it has, or remove it.',
    });
  });

  it('names the stopped item only for equipment, and "not listed" as none', () => {
    expect(requestFormSchema.parse(filled({ category: 'equipment', equipmentId })).equipmentId).toBe(
      equipmentId,
    );
    expect(
      requestFormSchema.parse(filled({ category: 'equipment', equipmentId: '' })).equipmentId,
    ).toBeNull();
    expect(requestFormSchema.parse(filled({ category: 'leak', equipmentId })).equipmentId).toBeNull();
  });

  it('keeps nothing on the device until something is typed or chosen', () => {
    expect(isBlankRequest(emptyRequestForm())).toBe(true);
    expect(isBlankRequest({ ...emptyRequestForm(), description: 'Water' })).toBe(false);
    expect(isBlankRequest({ ...emptyRequestForm(), someoneOnSite: false })).toBe(false);
  });
});

const defaults = (): SettingsFormValues => ({
  ackTargetMinutes: '30',
  firstAid: Object.fromEntries(
    urgentCategories.map((category) => [
      category,
      {
        steps: linesText(defaultFirstAid[category].steps),
        cautions: linesText(defaultFirstAid[category].cautions),
      },
    ]),
  ) as SettingsFormValues['firstAid'],
});

describe('the settings form', () => {
  it('sends the target and the first aid only, as the fee lives on the price list', () => {
    const input = settingsFormSchema.parse({ ...defaults(), ackTargetMinutes: '45' });
    expect(Object.keys(input).sort()).toEqual(['ackTargetMinutes', 'firstAid']);
    expect(input.ackTargetMinutes).toBe(45);
  });

  it('refuses a target outside 5 to 1440 minutes, against its field', () => {
    const issues = settingsFormSchema.safeParse({ ...defaults(), ackTargetMinutes: '2' }).error!.issues;
    expect(issues.map((issue) => issue.path)).toEqual([['ackTargetMinutes']]);
  });

  it('places server issues under the target or a category, and nothing else', () => {
    expect(settingsFieldFor('ackTargetMinutes')).toBe('ackTargetMinutes');
    expect(settingsFieldFor('firstAid.leak.steps.2')).toBe('firstAid.leak.steps');
    expect(settingsFieldFor('callOutFeeCents')).toBeNull();
  });

  it('sends the default text as null, so the category keeps following the default', () => {
    const input = settingsFormSchema.parse(defaults());
    expect(Object.values(input.firstAid).every((text) => text === null)).toBe(true);
  });

  it('sends the company’s own text line by line, blank lines dropped', () => {
    const form = defaults();
    form.firstAid.leak = { steps: 'Call us first.\n\n  Then switch off at the board.  ', cautions: '' };
    expect(settingsFormSchema.parse(form).firstAid.leak).toEqual({
      steps: ['Call us first.', 'Then switch off at the board.'],
      cautions: [],
    });
  });

  it('says what is wrong against the textarea, in lines', () => {
    const form = defaults();
    form.firstAid.power = { steps: `Short.\n${'x'.repeat(501)}`, cautions: '' };
    form.firstAid.other = { steps: '  ', cautions: '' };
    const issues = settingsFormSchema.safeParse(form).error!.issues;
    expect(issues).toContainEqual(
      expect.objectContaining({
        path: ['firstAid', 'power', 'steps'],
        message: 'Line 2 is longer than 500 characters.',
      }),
    );
    expect(issues).toContainEqual(
      expect.objectContaining({
        path: ['firstAid', 'other', 'steps'],
        message: 'Write at least one step, or reset to the default.',
      }),
    );
  });
});

describe('arrival times on the tank’s clock', () => {
  const london = wallInstantText('Europe/London', { required: true });

  it('reads a datetime-local value in the tank’s zone, whatever the device’s', () => {
    expect(london.parse('2026-07-01T14:30')).toBe('2026-07-01T13:30:00.000Z');
    expect(wallInstantText('America/New_York', { required: true }).parse('2026-12-02T09:00')).toBe(
      '2026-12-02T14:00:00.000Z',
    );
  });

  it('writes an instant back as the tank’s wall clock reads it', () => {
    expect(wallText('2026-07-01T13:30:00.000Z', 'Europe/London')).toBe('2026-07-01T14:30');
  });

  it('asks for a time when one is needed, and leaves an optional one out', () => {
    expect(london.safeParse('').error!.issues[0]!.message).toBe('Choose when a technician will arrive.');
    expect(wallInstantText('Europe/London', { required: false }).parse('')).toBeUndefined();
  });
});

describe('ages, targets and fees', () => {
  const minute = 60_000;
  const created = '2026-12-02T09:00:00.000Z';
  const at = (minutes: number) => Date.parse(created) + minutes * minute;

  it('says ages the way a dispatcher does', () => {
    expect(formatAge(20_000)).toBe('under 1 min');
    expect(formatAge(18 * minute)).toBe('18 min');
    expect(formatAge(65 * minute)).toBe('1 h 05 min');
    expect(formatAge((2 * 24 + 3) * 60 * minute)).toBe('2 d 3 h');
  });

  it('is over target only once the wait is longer than the target', () => {
    expect(waitAgainstTarget(created, 30, at(30))).toEqual({ waitedMs: 30 * minute, overByMs: null });
    expect(waitAgainstTarget(created, 30, at(48))).toEqual({ waitedMs: 48 * minute, overByMs: 18 * minute });
  });

  it('writes a fee from minor units in its currency, yen without decimals', () => {
    expect(formatMoney(8500, 'GBP')).toBe('£85.00');
    expect(formatMoney(12050, 'EUR')).toBe('€120.50');
    // en-GB marks the yen as JP¥ (CLDR), to tell it from the yuan.
    expect(formatMoney(8500, 'JPY')).toBe('JP¥8,500');
  });
});
