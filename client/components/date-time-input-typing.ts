import { fireEvent, screen, within } from '@testing-library/react';

/**
 * For component tests: types a form's `YYYY-MM-DDTHH:mm` string into the date and time fields
 * of the `DateTimeInput` (date-time-input.tsx) labelled `label` (inside `scope` when given), as a person would,
 * part by part.
 */
export function typeDateTime(label: string, value: string, scope?: HTMLElement): void {
  const q = scope ? within(scope) : screen;
  const [date, time] = value.split('T');
  fireEvent.change(q.getByLabelText(`${label} date`), { target: { value: date } });
  fireEvent.change(q.getByLabelText(`${label} time`), { target: { value: time } });
}

/** For component tests: what the `DateTimeInput` (date-time-input.tsx) labelled `label` holds, as `YYYY-MM-DDTHH:mm`. */
export function dateTimeShown(label: string, scope?: HTMLElement): string {
  const q = scope ? within(scope) : screen;
  return `${(q.getByLabelText(`${label} date`) as HTMLInputElement).value}T${(q.getByLabelText(`${label} time`) as HTMLInputElement).value}`;
}
