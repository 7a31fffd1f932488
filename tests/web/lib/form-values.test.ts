import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { blankAsUndefined, decimalText } from '../../../web/lib/form-values';

describe('decimalText', () => {
  const salinity = decimalText(z.number().min(0).max(50));

  it('reads a decimal point and a decimal comma alike', () => {
    expect(salinity.parse('35.2')).toBe(35.2);
    expect(salinity.parse(' 35,2 ')).toBe(35.2);
  });

  it('refuses "1,026": it could be 1.026 or 1026', () => {
    const result = decimalText().safeParse('1,026');
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.message).toBe('Write 1.026 or 1026 — a comma here could mean either.');
  });

  it('hands the number to the shared rule, whose message the person sees', () => {
    const result = decimalText(z.number().max(50, 'Salinity above 50 ppt is not plausible.')).safeParse('60');
    expect(result.error!.issues[0]!.message).toBe('Salinity above 50 ppt is not plausible.');
  });

  it('asks for a number when a required one is blank, and leaves an optional one out', () => {
    expect(decimalText().safeParse('').error!.issues[0]!.message).toBe('Enter a number.');
    expect(decimalText(z.number().optional()).parse('  ')).toBeUndefined();
  });

  it('refuses text that is not a number', () => {
    expect(decimalText().safeParse('7.5.1').error!.issues[0]!.message).toBe('Enter a number, such as 7.5.');
  });
});

describe('blankAsUndefined', () => {
  it('treats blank text as not given, so an optional shared field stays valid', () => {
    const name = blankAsUndefined(z.string().trim().min(1).max(120).optional());
    expect(name.parse('   ')).toBeUndefined();
    expect(name.parse(' Reef ')).toBe('Reef');
  });
});
