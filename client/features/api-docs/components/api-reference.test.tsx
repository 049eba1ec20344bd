import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, screen, waitFor, within } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { answersOf, groupOperations, operationTitle, taskOf, type HttpMethod } from './api-outline.ts';
import { ApiReference } from './api-reference.tsx';
import { OPENAPI_FIXTURE } from './openapi-fixture.ts';
import { schemaFields } from './schema-fields.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('groupOperations', () => {
  it('groups operations by what a person wants to do, tasks in page order, methods in GET, POST order within a path', () => {
    const groups = groupOperations(OPENAPI_FIXTURE);
    expect(groups.map((g) => [g.id, g.name])).toEqual([
      ['send', 'Send readings'],
      ['read', 'Read readings and analyses'],
      ['loggers', 'Set up loggers and channels'],
      ['lab', 'Lab, members and access'],
    ]);
    expect(groups[0].operations.map((o) => o.method)).toEqual(['get', 'post']);
    expect(groups[1].operations[0]).toMatchObject({
      path: '/api/v1/labs/{lab}/channels',
      title: 'List channels',
      auth: ['sessionCookie', 'personalToken'],
      permission: 'channels.read',
    });
    // An operation without `security` is listed as public.
    expect(groups[0].operations[0].auth).toEqual([]);
  });
});

describe('operationTitle / taskOf', () => {
  // Paths and methods of Lagbook's route table (server/http/**/*.routes.ts) as the document writes them.
  const cases: Array<[HttpMethod, string, string, string]> = [
    ['get', '/api/v1/labs/{lab}/channels/{channelId}/diagnostics', 'read', 'Read diagnostics of a channel'],
    ['get', '/api/v1/labs/{lab}/channels/{channelId}/readings.csv', 'read', 'Download readings of a channel as CSV'],
    ['post', '/api/v1/labs/{lab}/loggers/{loggerId}/retire', 'loggers', 'Retire a logger'],
    ['post', '/api/v1/labs/{lab}/loggers/{loggerId}/channels', 'loggers', 'Add a channel to a logger'],
    ['delete', '/api/v1/labs/{lab}/loggers/{loggerId}/keys/{keyId}', 'loggers', 'Revoke an ingest key'],
    ['post', '/api/v1/labs/{lab}/loggers/{loggerId}/uploads', 'send', 'Upload a file of readings'],
    ['post', '/api/v1/labs/{lab}/quarantine/resubmit', 'send', 'Send refused rows again'],
    ['post', '/api/v1/labs/{lab}/alerts/{alertId}/acknowledge', 'alerts', 'Acknowledge an alert'],
    ['get', '/api/v1/labs/{lab}/channels/{channelId}/alerts', 'alerts', 'List alerts of a channel'],
    ['get', '/api/v1/labs/{lab}/channels/{channelId}/notes', 'notes', 'List notes of a channel'],
    ['post', '/api/v1/labs/{lab}/invitations', 'lab', 'Invite someone to the lab'],
    ['post', '/api/v1/invitations/{lab}/{token}/accept', 'lab', 'Accept an invitation'],
    ['get', '/api/v1/labs/{lab}/billing/invoices', 'billing', 'List invoices'],
    ['get', '/healthz', 'service', 'Check the service’s health'],
  ];
  it.each(cases)('%s %s is “%s / %s”', (method, path, task, title) => {
    const tag = path.startsWith('/api/v1/labs/{lab}/') ? path.split('/')[5] : path.includes('invitations') ? 'account' : 'service';
    expect(taskOf(path, tag)).toBe(task);
    expect(operationTitle(method, path)).toBe(title);
  });

  it('never falls back to the bare method and path for a route of the table', () => {
    for (const [method, path] of cases) expect(operationTitle(method, path)).not.toMatch(/^(GET|POST|PUT|PATCH|DELETE) |\{/);
  });
});

describe('answersOf', () => {
  it('lists every status in order, the shared answers resolved from components.responses', () => {
    const answers = answersOf(OPENAPI_FIXTURE.paths['/api/v1/labs/{lab}/tokens'].post as object, OPENAPI_FIXTURE);
    expect(answers.map((a) => a.status)).toEqual(['201', '400', '403', '409', '503']);
    expect(answers[0]).toEqual({ status: '201', description: 'The token, shown once.', mediaTypes: ['application/json'], headers: [] });
    // `$ref: '#/components/responses/InvalidInput'` and `…/Unavailable` (with its Retry-After header)
    expect(answers[1].description).toBe('The input failed validation (`invalid_input`).');
    expect(answers[4]).toEqual({
      status: '503',
      description: 'The database is unreachable (`service_unavailable`).',
      mediaTypes: ['application/json'],
      headers: ['Retry-After'],
    });
  });

  it('sorts a status range with its class and says where an unresolvable reference points', () => {
    const op = { responses: { '404': { $ref: '#/components/responses/Missing' }, '2XX': { description: 'Success.' }, '201': { description: 'Made.' } } };
    expect(answersOf(op, OPENAPI_FIXTURE).map((a) => [a.status, a.description])).toEqual([
      ['2XX', 'Success.'],
      ['201', 'Made.'],
      ['404', '(see #/components/responses/Missing)'],
    ]);
    expect(answersOf({}, OPENAPI_FIXTURE)).toEqual([]);
  });
});

describe('schemaFields', () => {
  it('flattens nested objects and arrays of objects, resolves $ref, reads nullable, enums, bounds and defaults', () => {
    const body = OPENAPI_FIXTURE.paths['/api/v1/labs/{lab}/loggers'].post as { requestBody: { content: { 'application/json': { schema: object } } } };
    const rows = schemaFields(body.requestBody.content['application/json'].schema, OPENAPI_FIXTURE);
    expect(rows.map((r) => [r.name, r.type, r.required, r.constraints])).toEqual([
      ['site', 'string or null', false, ['at most 120 characters']],
      ['format', 'string', false, ['one of "long", "wide"']],
      ['channels', 'array of object', true, ['at most 64 items', 'default []']],
      ['channels[].key', 'string', true, ['matches ^[A-Za-z0-9][A-Za-z0-9_.-]{0,63}$']],
      ['channels[].validMin', 'number or null', false, []],
      ['owner', 'object', false, []],
      ['owner.email', 'string', true, ['format email']],
    ]);
    expect(rows.find((r) => r.name === 'owner')?.description).toBe('who owns it');
  });
});

describe('API reference page', () => {
  it('lists each operation under its task with a plain title, the method and path as one line, who may call it and its inputs', async () => {
    const api = fakeApi({ 'GET /api/v1/openapi.json': () => ({ status: 200, body: OPENAPI_FIXTURE }) });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    expect((await screen.findByRole('heading', { level: 1 })).textContent).toBe('Lagbook API');
    expect(api.requests.map((r) => r.path)).toEqual(['/api/v1/openapi.json']);
    expect(screen.getByRole('link', { name: '/api/v1/openapi.json' }).getAttribute('href')).toBe('/api/v1/openapi.json');
    expect(screen.getAllByTestId('api-operation')).toHaveLength(5);
    const sections = within(screen.getByRole('navigation', { name: 'API sections' })).getAllByRole('link');
    expect(sections.map((a) => [a.textContent, a.getAttribute('href')])).toEqual([
      ['Send readings', '#api-send'],
      ['Read readings and analyses', '#api-read'],
      ['Set up loggers and channels', '#api-loggers'],
      ['Lab, members and access', '#api-lab'],
    ]);

    const tokens = screen.getByRole('article', { name: 'Make a personal token' });
    expect(within(tokens).getByTestId('api-request-line').textContent).toBe('POST /api/v1/labs/{lab}/tokens');
    expect(within(tokens).getByText('Make a personal API token.')).toBeTruthy();
    // the inputs, answers and example sit behind one closed disclosure that says what it holds
    const details = within(tokens).getByTestId('api-details');
    expect(details.hasAttribute('open')).toBe(false);
    expect(details.querySelector('summary')!.textContent).toMatch(/^What it takes \(\d+ fields\), 5 possible answers and an example$/);
    // who may call it, with the roles that hold the permission (server/policies/permissions.ts)
    expect(within(tokens).getByTestId('api-who').textContent).toBe(
      'Lab members whose role holds the permission tokens.manage-own (admin, technician and scientist), signed in with a browser session.',
    );
    const bodyList = within(tokens).getByRole('heading', { name: 'In the body (application/json)' }).nextElementSibling as HTMLElement;
    const name = within(bodyList).getByText('name', { selector: 'code' }).closest('[data-testid="api-field"]')!;
    expect(name.textContent).toContain('string · must be sent');
    expect(name.textContent).toContain('1–80 characters');
    expect(within(bodyList).getByText('expiresInDays', { selector: 'code' }).closest('[data-testid="api-field"]')!.textContent).toContain('≥ 1; ≤ 365');

    const channels = screen.getByRole('article', { name: 'List channels' });
    expect(within(channels).getByTestId('api-who').textContent).toContain('signed in with a browser session or a personal token.');
    const query = within(channels).getByRole('heading', { name: 'In the query' }).nextElementSibling as HTMLElement;
    const page = within(query).getByText('page', { selector: 'code' }).closest('[data-testid="api-field"]')!;
    // zod's safe-integer bounds are left out; the default stays.
    expect(page.textContent).toContain('default 1');
    expect(page.textContent).not.toContain('9007199254740991');

    const ingest = screen.getByRole('article', { name: 'Send readings' });
    expect(within(ingest).getByTestId('api-who').textContent).toBe('The caller, signed in with a logger’s ingest key.');
    expect(within(ingest).getByRole('heading', { name: 'In the body (text/csv)' }).nextElementSibling!.textContent).toContain(
      'CSV text with the header channel,ts,value',
    );
    expect(screen.getByText('Bearer lbt_<prefix>_<secret>')).toBeTruthy();
    // Backticked spans of a description are set as code.
    expect(screen.getByText('/api/v1/labs/{lab}', { selector: 'code' })).toBeTruthy();
    // the shared refusal body is listed once, from components.schemas.Error
    expect(screen.getByRole('heading', { name: 'When a request is refused' })).toBeTruthy();
  });

  it('uses no coloured method badges: the method is plain text in the request line', async () => {
    fakeApi({ 'GET /api/v1/openapi.json': () => ({ status: 200, body: OPENAPI_FIXTURE }) });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    for (const line of await screen.findAllByTestId('api-request-line')) {
      expect(line.textContent).toMatch(/^(GET|POST|PUT|PATCH|DELETE) \/\S+$/);
      for (const el of [line, ...line.querySelectorAll('*')]) expect(el.className).not.toMatch(/\b(bg|border)-/);
    }
  });

  it('shows the answers of each operation with their plain meaning, shared ones resolved, with media types and headers', async () => {
    fakeApi({ 'GET /api/v1/openapi.json': () => ({ status: 200, body: OPENAPI_FIXTURE }) });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    const tokens = await screen.findByRole('article', { name: 'Make a personal token' });
    const answers = within(tokens).getAllByTestId('api-answer');
    expect(answers.map((a) => a.getAttribute('data-status'))).toEqual(['201', '400', '403', '409', '503']);
    const answer = (status: string) => answers.find((a) => a.getAttribute('data-status') === status)!.textContent;
    expect(answer('201')).toBe('201 MadeThe token, shown once. Sent as application/json.');
    expect(answer('403')).toContain('Not allowed for this role');
    expect(answer('403')).toContain('The role does not allow this (forbidden).');
    expect(answer('409')).toContain('token_limit_reached: this person has as many tokens');
    expect(answer('503')).toContain('header Retry-After');
    expect(within(tokens).getByText('invalid_input', { selector: 'code' })).toBeTruthy();

    const ingest = screen.getByRole('article', { name: 'Send readings' });
    expect(
      within(ingest)
        .getAllByTestId('api-answer')
        .map((a) => a.getAttribute('data-status')),
    ).toEqual(['200', '429']);
    // an operation that documents no answers shows no answer list
    expect(within(screen.getByRole('article', { name: 'Read readings' })).queryAllByTestId('api-answer')).toHaveLength(0);
  });

  it('gives each operation an example request to copy, with the body fields that must be sent', async () => {
    fakeApi({ 'GET /api/v1/openapi.json': () => ({ status: 200, body: OPENAPI_FIXTURE }) });
    const writeText = vi.fn(async () => {});
    vi.stubGlobal('navigator', { ...navigator, clipboard: { writeText } });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    const loggers = await screen.findByRole('article', { name: 'Add a logger' });
    const example = within(loggers).getByTestId('api-example').textContent!;
    expect(example.split('\n').slice(0, 3)).toEqual(['POST /api/v1/labs/{lab}/loggers', 'Cookie: <your browser session>', 'Content-Type: application/json']);
    expect(JSON.parse(example.split('\n\n')[1])).toEqual({ channels: [] });
    const channels = screen.getByRole('article', { name: 'List channels' });
    expect(within(channels).getByTestId('api-example').textContent).toBe('GET /api/v1/labs/{lab}/channels\nAuthorization: Bearer <your personal token>');
    fireEvent.click(within(loggers).getByRole('button', { name: 'Copy the example request of “Add a logger”' }));
    await waitFor(() => expect(writeText).toHaveBeenCalledWith(example));
  });

  it('says so when the document cannot be loaded', async () => {
    fakeApi({ 'GET /api/v1/openapi.json': () => apiError(503, 'unavailable', 'The API document is not available.') });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    expect((await screen.findByRole('alert')).textContent).toBe('The API document is not available.');
  });
});
