import { describe, expect, it } from 'vitest';
import { emptyReport, visitReportContent, type VisitReportContent } from '@shared/schemas/visits';
import {
  formValuesOf,
  keptFormValues,
  reportFormSchema,
  type ReportFormValues,
} from '../../../../web/features/visits/utils/report-form';

const zone = 'Europe/London';
const saltId = '6f1d2c3b-4a5e-4f60-8a7b-9c0d1e2f3a4b';
const heaterId = '0a1b2c3d-4e5f-4a6b-8c7d-8e9fa0b1c2d3';
const equipmentId = '8d5e1c2a-7b4f-4e0a-9c1d-2f3a4b5c6d7e';

const report = (changes: Partial<VisitReportContent> = {}): VisitReportContent =>
  visitReportContent.parse({
    arrivedAt: '2026-07-01T08:30:00.000Z',
    departedAt: '2026-07-01T09:45:00.000Z',
    tasksDone: ['water-change', 'equipment-check'],
    waterChange: { percent: 10, litres: 45, newSalinityPpt: 35 },
    equipmentChecks: [{ equipmentId, state: 'needs-attention', note: 'Impeller worn' }],
    notes: 'All well.',
    nextItems: ['Replace the impeller'],
    ...changes,
  });

const valuesWith = (itemsUsed: ReportFormValues['itemsUsed']): ReportFormValues => ({
  ...formValuesOf(emptyReport, zone, []),
  itemsUsed,
});

describe('the report form', () => {
  it('turns a stored report into the screen’s text and back unchanged', () => {
    const content = report({
      itemsUsed: [
        { priceItemId: saltId, quantity: 1.5 },
        { priceItemId: heaterId, quantity: 1 },
      ],
    });
    const values = formValuesOf(content, zone, [equipmentId]);
    expect(values.arrivedAt).toBe('2026-07-01T09:30');
    expect(values.itemsUsed).toEqual([
      { priceItemId: saltId, quantity: '1.5' },
      { priceItemId: heaterId, quantity: '1' },
    ]);
    expect(reportFormSchema(zone).parse(values)).toEqual(content);
  });

  it('gives every piece of the tank’s equipment a row, and sends only the ones checked', () => {
    const other = '1c2d3e4f-5a6b-4c7d-8e9f-a0b1c2d3e4f5';
    const values = formValuesOf(report(), zone, [other, equipmentId]);
    expect(values.equipmentChecks.map((check) => check.equipmentId)).toEqual([other, equipmentId]);
    expect(reportFormSchema(zone).parse(values).equipmentChecks).toEqual([
      { equipmentId, state: 'needs-attention', note: 'Impeller worn' },
    ]);
  });

  it('reads a quantity typed with a decimal comma', () => {
    const content = reportFormSchema(zone).parse(valuesWith([{ priceItemId: saltId, quantity: '0,25' }]));
    expect(content.itemsUsed).toEqual([{ priceItemId: saltId, quantity: 0.25 }]);
  });

  it('says what is wrong with a quantity against its own field', () => {
    const result = reportFormSchema(zone).safeParse(
      valuesWith([
        { priceItemId: saltId, quantity: '1.255' },
        { priceItemId: heaterId, quantity: '0' },
        { priceItemId: saltId, quantity: '' },
      ]),
    );
    const messages = result.error!.issues.map((issue) => [issue.path.join('.'), issue.message]);
    expect(messages).toEqual([
      ['itemsUsed.0.quantity', 'at most two decimals'],
      ['itemsUsed.1.quantity', 'more than 0'],
      ['itemsUsed.2.quantity', 'enter a quantity'],
    ]);
  });

  it('sends no consumables or parts when none were chosen', () => {
    expect(reportFormSchema(zone).parse(valuesWith([])).itemsUsed).toEqual([]);
  });

  it('opens a copy kept on the phone before reports named consumables and parts', () => {
    const { itemsUsed: _left, ...older } = formValuesOf(report(), zone, []);
    const kept = keptFormValues(older as ReportFormValues);
    expect(kept.itemsUsed).toEqual([]);
    expect(reportFormSchema(zone).parse(kept).notes).toBe('All well.');
  });

  it('keeps the items a newer copy on the phone holds', () => {
    const values = valuesWith([{ priceItemId: saltId, quantity: '2' }]);
    expect(keptFormValues(values)).toEqual(values);
  });
});
