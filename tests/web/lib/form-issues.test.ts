import { createFormControl } from 'react-hook-form';
import { describe, expect, it } from 'vitest';
import { ApiError } from '../../../web/lib/api-client';
import { applyServerIssues } from '../../../web/lib/form-issues';

function tankForm() {
  return createFormControl({
    defaultValues: { name: '', displayVolume: { value: '', unit: 'litres' }, notes: '' },
  });
}

const invalid = (...issues: { path: string; message: string }[]) =>
  new ApiError(400, 'invalid_request', 'Some fields need attention.', issues);

describe('applyServerIssues', () => {
  it('puts each issue of a 400 under the field its path names, nested paths included', () => {
    const form = tankForm();
    applyServerIssues(
      form,
      invalid(
        { path: 'body.name', message: 'Name the tank.' },
        { path: 'body.displayVolume.value', message: 'Enter the display volume.' },
      ),
    );
    expect(form.control._formState.errors.name?.message).toBe('Name the tank.');
    expect(form.control._formState.errors.displayVolume?.value?.message).toBe('Enter the display volume.');
    expect(form.control._formState.errors.root).toBeUndefined();
  });

  it('keeps the first message when a field has several', () => {
    const form = tankForm();
    applyServerIssues(
      form,
      invalid({ path: 'body.name', message: 'Too long.' }, { path: 'body.name', message: 'Second.' }),
    );
    expect(form.control._formState.errors.name?.message).toBe('Too long.');
  });

  it('puts issues no field owns in the form-wide problem', () => {
    const form = tankForm();
    applyServerIssues(
      form,
      invalid(
        { path: 'body.name', message: 'Name the tank.' },
        { path: 'body.technicianId', message: 'Unknown.' },
      ),
    );
    expect(form.control._formState.errors.name?.message).toBe('Name the tank.');
    expect(form.control._formState.errors.root?.server?.message).toBe('Unknown.');
  });

  it('renames a server path when the form is shaped differently', () => {
    const form = tankForm();
    applyServerIssues(form, invalid({ path: 'body.label', message: 'Name the tank.' }), (path) =>
      path === 'label' ? 'name' : path,
    );
    expect(form.control._formState.errors.name?.message).toBe('Name the tank.');
  });

  it('says the API refused when it is not a 400 with issues, in its own words', () => {
    const form = tankForm();
    applyServerIssues(form, new ApiError(409, 'conflict', 'That name is taken.'));
    expect(form.control._formState.errors.root?.server?.message).toBe('That name is taken.');
  });

  it('says the connection failed when Brinewatch could not be reached', () => {
    const form = tankForm();
    applyServerIssues(form, new ApiError(0, 'network_error', 'offline'));
    expect(form.control._formState.errors.root?.server?.message).toMatch(/could not be reached/);
  });
});
