import type { ReactElement } from 'react';
import { vi } from 'vitest';
import { render } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router-dom';

/** One request the fake API received. */
export interface SeenRequest {
  method: string;
  path: string;
  body: unknown;
}

type Reply = { status: number; body?: unknown };
type Handler = (req: SeenRequest) => Reply | Promise<Reply>;

/**
 * Replaces `fetch` with a fake API for component tests: `handlers` maps `"METHOD /path"`
 * (path without query string) to a reply; unknown routes answer 599 so a test notices.
 * Every request is recorded, with its query string, in `requests`.
 */
export function fakeApi(handlers: Record<string, Handler>) {
  const requests: SeenRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(String(input), 'http://lagbook.test');
    const method = (init.method ?? 'GET').toUpperCase();
    const req: SeenRequest = {
      method,
      path: url.pathname + url.search,
      body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined,
    };
    requests.push(req);
    const handler = handlers[`${method} ${url.pathname}`];
    const reply = handler ? await handler(req) : { status: 599, body: { error: { code: 'no_fake', message: `${method} ${url.pathname}` } } };
    return new Response(reply.status === 204 ? null : JSON.stringify(reply.body ?? {}), {
      status: reply.status,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { requests, fetchMock };
}

/** An API error answer in the contract's shape. */
export function apiError(status: number, code: string, message: string): Reply {
  return { status, body: { error: { code, message } } };
}

/**
 * Renders `routes` (or a single element at `/`) inside a fresh TanStack Query client (no
 * retries) and an in-memory router starting at `url`.
 */
export function renderWithProviders(ui: ReactElement | RouteObject[], url = '/') {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  const routes: RouteObject[] = Array.isArray(ui) ? ui : [{ path: '*', element: ui }];
  const router = createMemoryRouter(routes, { initialEntries: [url] });
  const view = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...view, router, queryClient };
}
