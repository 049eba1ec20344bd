import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, screen, within } from '@testing-library/react';
import { apiError, fakeApi, renderWithProviders } from '../../../components/test-harness.tsx';
import { answersOf, groupOperations } from './api-outline.ts';
import { ApiReference } from './api-reference.tsx';
import { OPENAPI_FIXTURE } from './openapi-fixture.ts';
import { schemaFields } from './schema-fields.ts';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('groupOperations', () => {
  it('groups operations by tag in alphabetical order, methods in GET, POST order within a path', () => {
    const groups = groupOperations(OPENAPI_FIXTURE);
    expect(groups.map((g) => g.name)).toEqual(['channels', 'ingest', 'loggers', 'tokens']);
    expect(groups[1].operations.map((o) => o.method)).toEqual(['get', 'post']);
    expect(groups[0].operations[0]).toMatchObject({
      path: '/api/v1/labs/{lab}/channels',
      auth: ['sessionCookie', 'personalToken'],
      permission: 'channels.read',
    });
    // An operation without `security` is listed as public.
    expect(groups[1].operations[0].auth).toEqual([]);
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
  it('fetches the server’s document and shows each operation with method, path, summary, who may call it and its inputs', async () => {
    const api = fakeApi({ 'GET /api/v1/openapi.json': () => ({ status: 200, body: OPENAPI_FIXTURE }) });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    expect((await screen.findByRole('heading', { level: 1 })).textContent).toBe('Lagbook API');
    expect(api.requests.map((r) => r.path)).toEqual(['/api/v1/openapi.json']);
    expect(screen.getByRole('link', { name: '/api/v1/openapi.json' }).getAttribute('href')).toBe('/api/v1/openapi.json');
    expect(screen.getAllByTestId('api-operation')).toHaveLength(5);
    const sections = within(screen.getByRole('navigation', { name: 'API sections' })).getAllByRole('link');
    expect(sections.map((a) => a.textContent)).toEqual(['channels (1)', 'ingest (2)', 'loggers (1)', 'tokens (1)']);

    const tokens = screen.getByRole('article', { name: 'post /api/v1/labs/{lab}/tokens' });
    expect(within(tokens).getByText('Make a personal API token.')).toBeTruthy();
    expect(tokens.textContent).toContain('Accepts: browser session · needs the permission tokens.manage-own');
    const body = within(tokens).getByRole('table', { name: 'Body (application/json)' });
    const nameRow = within(body).getByRole('rowheader', { name: 'name' }).closest('tr')!;
    expect(nameRow.textContent).toContain('string');
    expect(nameRow.textContent).toContain('required');
    expect(nameRow.textContent).toContain('1–80 characters');
    expect(within(body).getByRole('rowheader', { name: 'expiresInDays' }).closest('tr')!.textContent).toContain('≥ 1; ≤ 365');

    const channels = screen.getByRole('article', { name: 'get /api/v1/labs/{lab}/channels' });
    expect(channels.textContent).toContain('Accepts: browser session or personal token');
    const page = within(within(channels).getByRole('table', { name: 'Query' }))
      .getByRole('rowheader', { name: 'page' })
      .closest('tr')!;
    // zod's safe-integer bounds are left out; the default stays.
    expect(page.textContent).toContain('default 1');
    expect(page.textContent).not.toContain('9007199254740991');

    const ingest = screen.getByRole('article', { name: 'post /api/v1/ingest' });
    expect(ingest.textContent).toContain('Accepts: ingest key');
    expect(within(ingest).getByRole('table', { name: 'Body (text/csv)' }).textContent).toContain('CSV text with the header channel,ts,value');
    expect(screen.getByText('Bearer lbt_<prefix>_<secret>')).toBeTruthy();
    // Backticked spans of a description are set as code.
    expect(screen.getByText('/api/v1/labs/{lab}', { selector: 'code' })).toBeTruthy();
  });

  it('shows the answers of each operation, shared ones resolved, with their media types and headers', async () => {
    fakeApi({ 'GET /api/v1/openapi.json': () => ({ status: 200, body: OPENAPI_FIXTURE }) });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    const tokens = await screen.findByRole('article', { name: 'post /api/v1/labs/{lab}/tokens' });
    const answers = within(tokens).getByRole('table', { name: 'Answers' });
    expect(
      within(answers)
        .getAllByRole('rowheader')
        .map((h) => h.textContent),
    ).toEqual(['201', '400', '403', '409', '503']);
    const row = (status: string) => within(answers).getByRole('rowheader', { name: status }).closest('tr')!.textContent;
    expect(row('201')).toContain('The token, shown once. (application/json)');
    expect(row('403')).toContain('The role does not allow this (forbidden).');
    expect(row('409')).toContain('token_limit_reached: this person has as many tokens');
    expect(row('503')).toContain('header Retry-After');
    expect(within(answers).getByText('invalid_input', { selector: 'code' })).toBeTruthy();

    const ingest = screen.getByRole('article', { name: 'post /api/v1/ingest' });
    expect(
      within(within(ingest).getByRole('table', { name: 'Answers' }))
        .getAllByRole('rowheader')
        .map((h) => h.textContent),
    ).toEqual(['200', '429']);
    // an operation that documents no answers shows no answers table
    expect(within(screen.getByRole('article', { name: 'get /api/v1/ingest' })).queryByRole('table', { name: 'Answers' })).toBeNull();
  });

  it('says so when the document cannot be loaded', async () => {
    fakeApi({ 'GET /api/v1/openapi.json': () => apiError(503, 'unavailable', 'The API document is not available.') });
    renderWithProviders(<ApiReference origin="http://127.0.0.1:5310" />);
    expect((await screen.findByRole('alert')).textContent).toBe('The API document is not available.');
  });
});
