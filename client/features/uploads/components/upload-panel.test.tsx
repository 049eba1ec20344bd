import { afterEach, describe, expect, it, vi } from 'vitest';
import { act, cleanup, fireEvent, screen, within } from '@testing-library/react';
import { renderWithProviders } from '../../../components/test-harness.tsx';
import { UploadPanel } from './upload-panel.tsx';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** A stand-in for XMLHttpRequest that records the request and lets the test play the server. */
class FakeXhr {
  static last: FakeXhr | null = null;
  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: unknown = null;
  status = 0;
  responseText = '';
  upload: { onprogress: ((e: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
  onprogress: (() => void) | null = null;
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  aborted = false;
  constructor() {
    FakeXhr.last = this;
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  send(body: unknown) {
    this.body = body;
  }
  abort() {
    this.aborted = true;
    this.onabort?.();
  }
  /** The server answers 200 and streams `text` (more may follow). */
  stream(text: string) {
    this.status = 200;
    this.responseText += text;
    this.onprogress?.();
  }
}

// A wide export of a fictional logger (demo data, invented): time, two channels and a battery column to skip.
const CSV = 'time;air_t;rh;battery_v\n2026-09-01T00:00:00+03:00;12.5;80;3.61\n2026-09-01T00:10:00+03:00;n/a;81;3.61\n2026-09-01T00:20:00+03:00;12.1;82;3.60\n';
const CHANNELS = [
  { key: 'air_t', label: 'Air temperature' },
  { key: 'rh', label: 'Relative humidity' },
];

function renderPanel() {
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  FakeXhr.last = null;
  return renderWithProviders(
    <UploadPanel slug="fernhollow" loggerId={5} loggerTimeZone="Africa/Nairobi" channels={CHANNELS} quarantineHref="/labs/fernhollow/quarantine?loggerId=5" />,
  );
}

async function chooseFile(text: string, name = 'hedgerow-2026-09.csv') {
  const file = new File([text], name, { type: 'text/csv' });
  fireEvent.change(screen.getByLabelText('Export file (CSV, up to 2 GB)'), { target: { files: [file] } });
  await screen.findByText(`First ${text.trim().split('\n').length - 1} rows of ${name}`);
  return file;
}

describe('UploadPanel', () => {
  it('previews the file with its detected delimiter and maps columns named like channels, skipping the rest', async () => {
    renderPanel();
    await chooseFile(CSV);
    const preview = screen.getByRole('table', { name: /First 3 rows/ });
    expect(
      within(preview)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['time', 'air_t', 'rh', 'battery_v']);
    expect(within(preview).getByText('n/a')).toBeTruthy();
    expect((screen.getByLabelText('Delimiter') as HTMLSelectElement).value).toBe(';');
    expect((screen.getByLabelText('Wide: a time column and one column per channel') as HTMLInputElement).checked).toBe(true);
    expect((screen.getByLabelText('Time column') as HTMLSelectElement).value).toBe('time');
    expect((screen.getByLabelText('Column “air_t”') as HTMLSelectElement).value).toBe('air_t');
    expect((screen.getByLabelText('Column “battery_v”') as HTMLSelectElement).value).toBe('');
    expect((screen.getByLabelText('Time zone of times without offset') as HTMLSelectElement).value).toBe('Africa/Nairobi');
  });

  it('refuses a mapping the server schema would refuse, without sending anything', async () => {
    renderPanel();
    await chooseFile(CSV);
    fireEvent.change(screen.getByLabelText('Column “air_t”'), { target: { value: '' } });
    fireEvent.change(screen.getByLabelText('Column “rh”'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Start the upload' }));
    expect(screen.getByText('Columns and their channels: a wide file needs at least one column stored under a channel.')).toBeTruthy();
    expect(FakeXhr.last).toBeNull();
  });

  it('sends the file with its options, shows bytes sent and readings stored as lines arrive, then the summary', async () => {
    renderPanel();
    const file = await chooseFile(CSV);
    fireEvent.click(screen.getByRole('button', { name: 'Start the upload' }));
    const xhr = FakeXhr.last!;
    expect(xhr.method).toBe('POST');
    const url = new URL(xhr.url, 'http://lagbook.test');
    expect(url.pathname).toBe('/api/v1/labs/fernhollow/loggers/5/uploads');
    expect(JSON.parse(url.searchParams.get('options')!)).toEqual({
      format: 'wide',
      delimiter: ';',
      timeColumn: 'time',
      columns: { air_t: 'air_t', rh: 'rh', battery_v: null },
      timeFormat: 'auto',
      timeZone: 'Africa/Nairobi',
    });
    expect(xhr.headers['Content-Type']).toBe('text/csv');
    expect(xhr.body).toBe(file);

    act(() => xhr.upload.onprogress!({ loaded: 100, total: file.size, lengthComputable: true }));
    expect(screen.getByLabelText(/Sending the file: 100 B of/).getAttribute('value')).toBe('100');
    // A progress line cut in two, as a network chunk may cut it.
    act(() => xhr.stream('{"type":"progress","lines":2,"readings":4,"accepted":4,"dupl'));
    expect(screen.getByRole('status').textContent).toContain('waiting for the first batch');
    act(() => xhr.stream('icates":0,"quarantined":0}\n'));
    expect(screen.getByRole('status').textContent).toContain('4 readings stored so far from 2 lines');

    act(() => {
      xhr.stream(
        '{"type":"summary","lines":3,"readings":6,"accepted":5,"duplicates":0,"quarantined":1,"firstQuarantined":[{"index":2,"code":"bad_value","reason":"value: must be a finite number","line":3}]}\n',
      );
      xhr.onload!();
    });
    const summary = await screen.findByRole('region', { name: 'Import finished' });
    const count = (id: string) => within(summary).getByTestId(`summary-${id}`).textContent;
    expect([count('lines'), count('readings'), count('stored'), count('duplicates'), count('quarantined')]).toEqual(['3', '6', '5', '0', '1']);
    const row = within(summary).getAllByRole('row')[1];
    expect(
      within(row)
        .getAllByRole('cell')
        .map((c) => c.textContent),
    ).toEqual(['3', 'value: must be a finite number']);
    expect(within(summary).getByRole('link', { name: 'Review the quarantined rows' }).getAttribute('href')).toBe('/labs/fernhollow/quarantine?loggerId=5');
  });

  it('shows a refusal before the import began, and an error line after it began', async () => {
    renderPanel();
    await chooseFile(CSV);
    fireEvent.click(screen.getByRole('button', { name: 'Start the upload' }));
    act(() => {
      const xhr = FakeXhr.last!;
      xhr.status = 409;
      xhr.responseText = JSON.stringify({ error: { code: 'logger_retired', message: 'This logger is retired; its history cannot be extended.' } });
      xhr.onload!();
    });
    expect((await screen.findByRole('alert')).textContent).toBe('This logger is retired; its history cannot be extended.');

    fireEvent.click(screen.getByRole('button', { name: 'Start the upload' }));
    act(() => {
      const xhr = FakeXhr.last!;
      xhr.stream(
        '{"type":"progress","lines":1,"readings":2,"accepted":2,"duplicates":0,"quarantined":0}\n{"type":"error","code":"upload_failed","message":"The upload stopped."}\n',
      );
      xhr.onload!();
    });
    expect((await screen.findByRole('alert')).textContent).toBe('The upload stopped. Stored before it stopped: 2 readings.');
  });

  it('re-reads the preview when the delimiter is changed by hand', async () => {
    renderPanel();
    await chooseFile('time,air_t\n2026-09-01T00:00:00Z,12.5\n');
    fireEvent.change(screen.getByLabelText('Delimiter'), { target: { value: ';' } });
    const preview = screen.getByRole('table', { name: /First 1 rows/ });
    expect(
      within(preview)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['time,air_t']);
  });
});
