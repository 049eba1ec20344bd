import { useState } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { DateInput, DateTimeInput, stepDate, stepTime } from './date-time-input.tsx';
import { readDateTime, readDay } from './date-time-input-read.ts';
import { instantAtWallClock } from './date-time-input-wall-clock.ts';
import { monthWeeks } from './date-time-input-month.tsx';

// Check instants: the IANA time zone database as Python 3.11's zoneinfo reads it (`/usr/bin/python3`,
// `datetime(…, tzinfo=ZoneInfo(zone), fold=0).astimezone(timezone.utc)`); Europe/Berlin changes at 01:00 UTC
// on the last Sunday of March and of October (EU Directive 2000/84/EC arts. 2–3): 2026-03-29 and 2026-10-25.
afterEach(cleanup);

const iso = (ms: number) => new Date(ms).toISOString();
/** The text an element's aria-describedby points at, as assistive technology reads it. */
const description = (el: HTMLElement) =>
  (el.getAttribute('aria-describedby') ?? '')
    .split(' ')
    .filter(Boolean)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ');

describe('reading a typed date and time', () => {
  it('reads an ordinary time on the zone clock', () => {
    // zoneinfo: 2026-12-03 14:00 Europe/Berlin = 13:00Z
    expect(readDateTime('2026-12-03T14:00', 'Europe/Berlin')).toEqual({ ok: true, ms: Date.parse('2026-12-03T13:00:00Z'), notice: null });
    // 9:05 and 0905 are the same time
    expect(readDateTime('2026-12-03T9:05', 'UTC')).toMatchObject({ ok: true, ms: Date.parse('2026-12-03T09:05:00Z') });
    expect(readDateTime('2026-12-03T0905', 'UTC')).toMatchObject({ ok: true, ms: Date.parse('2026-12-03T09:05:00Z') });
  });

  it('refuses dates that do not exist instead of rolling them over', () => {
    expect(readDateTime('2026-02-30T10:00', 'UTC')).toEqual({ ok: false, part: 'date', problem: '2026-02-30 is not a date.' });
    // 2028 is a leap year, 2026 is not (Gregorian calendar rule, common practice)
    expect(readDateTime('2028-02-29T10:00', 'UTC').ok).toBe(true);
    expect(readDateTime('2026-02-29T10:00', 'UTC')).toMatchObject({ ok: false, problem: '2026-02-29 is not a date.' });
    expect(readDateTime('12/03/2026T10:00', 'UTC')).toMatchObject({
      ok: false,
      part: 'date',
      problem: 'Write the date as year-month-day, for example 2026-12-03.',
    });
    expect(readDateTime('T10:00', 'UTC')).toMatchObject({ ok: false, part: 'date', problem: 'Give a date.' });
  });

  it('refuses times outside the 24-hour clock', () => {
    expect(readDateTime('2026-12-03T24:00', 'UTC')).toMatchObject({
      ok: false,
      part: 'time',
      problem: '24:00 is not a time of day: hours run from 00 to 23 and minutes from 00 to 59.',
    });
    expect(readDateTime('2026-12-03T2:00 PM', 'UTC')).toMatchObject({ ok: false, part: 'time' });
    expect(readDateTime('2026-12-03T', 'UTC')).toMatchObject({ ok: false, part: 'time', problem: 'Give a time.' });
  });

  it('says when the clock skips the time, and uses the time after the jump', () => {
    const r = readDateTime('2026-03-29T02:30', 'Europe/Berlin');
    // zoneinfo fold=0: 02:30 is read at UTC+01:00 → 01:30Z, which the clock shows as 03:30
    expect(r).toEqual({
      ok: true,
      ms: Date.parse('2026-03-29T01:30:00Z'),
      notice: '02:30 does not happen on 2026-03-29 in Europe/Berlin: the clock skips an hour that night. 03:30 will be used.',
    });
  });

  it('says when the time happens twice, and uses the first', () => {
    const r = readDateTime('2026-10-25T02:30', 'Europe/Berlin');
    // zoneinfo fold=0: 02:30 CEST (UTC+02:00) = 00:30Z; the second 02:30 is 01:30Z
    expect(r).toEqual({
      ok: true,
      ms: Date.parse('2026-10-25T00:30:00Z'),
      notice: '02:30 happens twice on 2026-10-25 in Europe/Berlin (the clock goes back that night); the first one, at UTC+02:00, is used.',
    });
  });

  it('a skipped midnight in a zone behind UTC moves forward, not into the day before', () => {
    // America/Santiago skips 00:00–01:00 on 2026-09-06; zoneinfo fold=0: 00:30 → 04:30Z (01:30 at UTC−03:00)
    expect(iso(instantAtWallClock(Date.UTC(2026, 8, 6, 0, 30), 'America/Santiago').ms)).toBe('2026-09-06T04:30:00.000Z');
    expect(readDateTime('2026-09-06T00:30', 'America/Santiago')).toMatchObject({ notice: expect.stringContaining('01:30 will be used.') });
  });

  it('reads days for day filters: empty is no limit', () => {
    expect(readDay('')).toEqual({ ok: true, day: null });
    expect(readDay('2026-1-5')).toEqual({ ok: true, day: '2026-01-05' });
    expect(readDay('2026-13-01')).toEqual({ ok: false, problem: '2026-13-01 is not a date.' });
  });
});

describe('stepping parts with the arrow keys', () => {
  it('steps days across months and years, and keeps the day inside a shorter month', () => {
    expect(stepDate('2026-12-31', 2, 1)).toBe('2027-01-01');
    expect(stepDate('2026-03-01', 2, -1)).toBe('2026-02-28');
    expect(stepDate('2026-01-31', 1, 1)).toBe('2026-02-28');
    expect(stepDate('2028-02-29', 0, 1)).toBe('2029-02-28');
    expect(stepDate('2026-12-15', 1, 1)).toBe('2027-01-15');
    expect(stepDate('not a date', 2, 1)).toBeNull();
  });

  it('steps hours and minutes round the clock face', () => {
    expect(stepTime('23:10', 0, 1)).toBe('00:10');
    expect(stepTime('00:00', 1, -1)).toBe('00:59');
    expect(stepTime('14:00', 1, 1)).toBe('14:01');
  });
});

function Harness({ initial, zone = 'Europe/Berlin', error }: { initial: string; zone?: string; error?: string }) {
  const [value, setValue] = useState(initial);
  return (
    <>
      <DateTimeInput label="From" value={value} onChange={setValue} timeZone={zone} error={error} />
      <output data-testid="value">{value}</output>
    </>
  );
}

describe('DateTimeInput', () => {
  it('shows the date and 24-hour time as text fields with the zone named, never a browser date picker', () => {
    const { container } = render(<Harness initial="2026-12-03T14:00" />);
    const date = screen.getByLabelText('From date') as HTMLInputElement;
    const time = screen.getByLabelText('From time') as HTMLInputElement;
    expect(date.value).toBe('2026-12-03');
    expect(time.value).toBe('14:00');
    expect(date.type).toBe('text');
    expect(time.type).toBe('text');
    expect(date.inputMode).toBe('numeric');
    expect(container.querySelector('input[type="date"], input[type="datetime-local"], input[type="time"]')).toBeNull();
    // Berlin is UTC+01:00 in December (zoneinfo)
    expect(description(screen.getByRole('group', { name: 'From' }))).toBe('Europe/Berlin, UTC+01:00');
  });

  it('gives the form the YYYY-MM-DDTHH:mm string as the parts are typed', () => {
    render(<Harness initial="2026-12-03T14:00" />);
    fireEvent.change(screen.getByLabelText('From date'), { target: { value: '2026-12-24' } });
    fireEvent.change(screen.getByLabelText('From time'), { target: { value: '9:05' } });
    expect(screen.getByTestId('value').textContent).toBe('2026-12-24T9:05');
    fireEvent.blur(screen.getByLabelText('From time'));
    expect(screen.getByTestId('value').textContent).toBe('2026-12-24T09:05');
  });

  it('names an impossible date once the field is left, marked invalid and tied to the field', () => {
    render(<Harness initial="2026-02-03T10:00" />);
    const date = screen.getByLabelText('From date');
    fireEvent.change(date, { target: { value: '2026-02-30' } });
    expect(screen.queryByText('2026-02-30 is not a date.')).toBeNull();
    fireEvent.blur(date);
    expect(screen.getByText('2026-02-30 is not a date.')).toBeTruthy();
    expect(date.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByLabelText('From time').getAttribute('aria-invalid')).toBeNull();
    expect(description(screen.getByRole('group', { name: 'From' }))).toContain('2026-02-30 is not a date.');
  });

  it('explains a time the clock skips on the spring day, with the offset after the jump', () => {
    render(<Harness initial="2026-03-29T02:30" />);
    expect(screen.getByText(/02:30 does not happen on 2026-03-29 in Europe\/Berlin/)).toBeTruthy();
    expect(screen.getByText('Europe/Berlin, UTC+02:00')).toBeTruthy();
  });

  it('shows the caller’s own refusal instead of its own', () => {
    render(<Harness initial="2026-12-03T14:00" error="must be after the start" />);
    expect(screen.getByText('must be after the start')).toBeTruthy();
    expect(screen.getByLabelText('From date').getAttribute('aria-invalid')).toBe('true');
  });

  it('steps the part under the caret with arrow up and down', () => {
    render(<Harness initial="2026-12-31T23:59" />);
    const date = screen.getByLabelText('From date') as HTMLInputElement;
    date.setSelectionRange(9, 9);
    fireEvent.keyDown(date, { key: 'ArrowUp' });
    expect(screen.getByTestId('value').textContent).toBe('2027-01-01T23:59');
    date.setSelectionRange(6, 6);
    fireEvent.keyDown(date, { key: 'ArrowDown' });
    expect(screen.getByTestId('value').textContent).toBe('2026-12-01T23:59');
    const time = screen.getByLabelText('From time') as HTMLInputElement;
    time.setSelectionRange(1, 1);
    fireEvent.keyDown(time, { key: 'ArrowUp' });
    expect(screen.getByTestId('value').textContent).toBe('2026-12-01T00:59');
    time.setSelectionRange(4, 4);
    fireEvent.keyDown(time, { key: 'ArrowUp' });
    expect(screen.getByTestId('value').textContent).toBe('2026-12-01T00:00');
  });

  it('keeps letters out of the fields', () => {
    render(<Harness initial="2026-12-03T14:00" />);
    fireEvent.change(screen.getByLabelText('From time'), { target: { value: '2:00 PM' } });
    expect(screen.getByTestId('value').textContent).toBe('2026-12-03T2:00');
  });
});

describe('picking a day from a month', () => {
  it('lays a month out in whole ISO weeks from Monday', () => {
    // Python's calendar.Calendar(firstweekday=0).monthdatescalendar (`/usr/bin/python3`, 3.11): December 2026
    // runs in 5 weeks from 2026-11-30 to 2027-01-03, February 2026 in 5 from 2026-01-26, March 2026 in 6 to 2026-04-05
    const december = monthWeeks('2026-12-15');
    expect([december.length, december[0][0], december.at(-1)![6]]).toEqual([5, '2026-11-30', '2027-01-03']);
    const february = monthWeeks('2026-02-01');
    expect([february.length, february[0][0], february.at(-1)![6]]).toEqual([5, '2026-01-26', '2026-03-01']);
    const march = monthWeeks('2026-03-31');
    expect([march.length, march[0][0], march.at(-1)![6]]).toEqual([6, '2026-02-23', '2026-04-05']);
    expect(december.every((w) => w.length === 7)).toBe(true);
  });

  it('opens on the typed day, picks a tapped day and gives the focus back to the date field', () => {
    render(<Harness initial="2026-12-03T14:00" />);
    const toggle = screen.getByRole('button', { name: 'Pick the day from a month' });
    expect(toggle.getAttribute('aria-expanded')).toBe('false');
    fireEvent.click(toggle);
    const month = screen.getByRole('group', { name: 'From: pick a day' });
    expect(month.textContent).toContain('2026-12');
    expect(screen.getByRole('button', { name: '2026-12-03' }).getAttribute('aria-pressed')).toBe('true');
    fireEvent.click(screen.getByRole('button', { name: '2026-12-24' }));
    expect(screen.getByTestId('value').textContent).toBe('2026-12-24T14:00');
    expect(screen.queryByRole('group', { name: 'From: pick a day' })).toBeNull();
    expect(document.activeElement).toBe(screen.getByLabelText('From date'));
  });

  it('moves by day, week and month from the keyboard, and Escape closes it', () => {
    render(<Harness initial="2026-01-31T08:00" />);
    fireEvent.click(screen.getByRole('button', { name: 'Pick the day from a month' }));
    const month = screen.getByRole('group', { name: 'From: pick a day' });
    const day = (d: string) => screen.getByRole('button', { name: d });
    fireEvent.keyDown(day('2026-01-31'), { key: 'ArrowRight' });
    expect(document.activeElement).toBe(day('2026-02-01'));
    expect(month.textContent).toContain('2026-02');
    fireEvent.keyDown(day('2026-02-01'), { key: 'ArrowDown' });
    expect(document.activeElement).toBe(day('2026-02-08'));
    fireEvent.keyDown(day('2026-02-08'), { key: 'PageDown' });
    expect(document.activeElement).toBe(day('2026-03-08'));
    fireEvent.click(screen.getByRole('button', { name: 'Month before' }));
    expect(month.textContent).toContain('2026-02');
    fireEvent.keyDown(day('2026-02-08'), { key: 'Escape' });
    expect(screen.queryByRole('group', { name: 'From: pick a day' })).toBeNull();
    expect(screen.getByTestId('value').textContent).toBe('2026-01-31T08:00');
  });
});

describe('DateInput', () => {
  function DayHarness() {
    const [value, setValue] = useState('');
    return (
      <>
        <DateInput label="From day" value={value} onChange={setValue} />
        <output data-testid="day">{value}</output>
      </>
    );
  }

  it('takes a day, allows none, and names an impossible one', () => {
    render(<DayHarness />);
    const input = screen.getByLabelText('From day') as HTMLInputElement;
    expect(input.type).toBe('text');
    fireEvent.blur(input);
    expect(input.getAttribute('aria-invalid')).toBeNull();
    fireEvent.change(input, { target: { value: '2026-04-31' } });
    fireEvent.blur(input);
    expect(screen.getByText('2026-04-31 is not a date.')).toBeTruthy();
    expect(description(input)).toBe('2026-04-31 is not a date.');
    fireEvent.change(input, { target: { value: '2026-04-30' } });
    input.setSelectionRange(9, 9);
    fireEvent.keyDown(input, { key: 'ArrowUp' });
    expect(screen.getByTestId('day').textContent).toBe('2026-05-01');
    fireEvent.click(screen.getByRole('button', { name: 'Pick the day from a month' }));
    fireEvent.click(screen.getByRole('button', { name: '2026-05-19' }));
    expect(screen.getByTestId('day').textContent).toBe('2026-05-19');
  });
});
