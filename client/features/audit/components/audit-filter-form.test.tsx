import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { NO_AUDIT_FILTERS } from '../hooks/audit-search-params.ts';
import { AuditFilterForm } from './audit-filter-form.tsx';

afterEach(cleanup);

function show() {
  const onApply = vi.fn();
  render(<AuditFilterForm filters={NO_AUDIT_FILTERS} onApply={onApply} />);
  return onApply;
}

describe('AuditFilterForm days', () => {
  it('takes days as YYYY-MM-DD text, never a browser date picker, and applies them written out in full', () => {
    const onApply = show();
    const from = screen.getByLabelText('From day') as HTMLInputElement;
    expect(from.type).toBe('text');
    expect(from.placeholder).toBe('YYYY-MM-DD');
    fireEvent.change(from, { target: { value: '2026-1-5' } });
    fireEvent.change(screen.getByLabelText('To day'), { target: { value: '2026-01-09' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(onApply).toHaveBeenCalledWith({ ...NO_AUDIT_FILTERS, from: '2026-01-05', to: '2026-01-09', page: 1 });
  });

  it('names a day that does not exist on its own field and applies nothing', () => {
    const onApply = show();
    fireEvent.change(screen.getByLabelText('From day'), { target: { value: '2026-02-29' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    // 2026 is not a leap year (Gregorian calendar rule, common practice)
    expect(screen.getByText('2026-02-29 is not a date.')).toBeTruthy();
    expect(screen.getByLabelText('From day').getAttribute('aria-invalid')).toBe('true');
    expect(onApply).not.toHaveBeenCalled();
    fireEvent.change(screen.getByLabelText('To day'), { target: { value: '5.1.2026' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(screen.getByText('Write the date as year-month-day, for example 2026-12-03.')).toBeTruthy();
    expect(onApply).not.toHaveBeenCalled();
  });

  it('refuses a last day before the first day, and Clear empties both', () => {
    const onApply = show();
    fireEvent.change(screen.getByLabelText('From day'), { target: { value: '2026-01-09' } });
    fireEvent.change(screen.getByLabelText('To day'), { target: { value: '2026-01-05' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(screen.getByText('The last day must be on or after the first day.')).toBeTruthy();
    expect(onApply).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Clear' }));
    expect(onApply).toHaveBeenCalledWith(NO_AUDIT_FILTERS);
    expect((screen.getByLabelText('From day') as HTMLInputElement).value).toBe('');
  });
});
