import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import type { ReactNode } from 'react';
import { MemoryRouter, Route, Routes, useLocation } from 'react-router-dom';
import { vi } from 'vitest';

/** One request the component sent, as the server would receive it. */
export interface SentRequest {
  method: string;
  path: string;
  body: unknown;
}

/**
 * Replaces `fetch` for one test: `answer` plays the server for each request (status and JSON body),
 * and every request is recorded so a test can assert what the form sent, or that it sent nothing.
 */
export function fakeServer(answer: (request: SentRequest) => { status: number; body?: unknown }): SentRequest[] {
  const sent: SentRequest[] = [];
  vi.stubGlobal('fetch', async (input: string, init: RequestInit = {}) => {
    const request = {
      method: init.method ?? 'GET',
      path: String(input),
      body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined,
    };
    sent.push(request);
    const { status, body } = answer(request);
    return new Response(body === undefined ? null : JSON.stringify(body), {
      status,
      headers: { 'content-type': 'application/json' },
    });
  });
  return sent;
}

/**
 * The text read out with a control: the elements its `aria-describedby` names (hint, then error), joined.
 * The forms put each field's message there, so "the message stands at its field" is this text.
 */
export function descriptionOf(control: Element): string {
  return (control.getAttribute('aria-describedby') ?? '')
    .split(/\s+/)
    .filter(Boolean)
    .map((id) => document.getElementById(id)?.textContent ?? '')
    .join(' ');
}

function CurrentPath() {
  const location = useLocation();
  return <div data-testid="current-path">{location.pathname + location.search}</div>;
}

/** Renders `ui` at `path` inside the app's providers (a fresh query cache, a memory router). */
export function renderAt(path: string, ui: ReactNode) {
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  return render(
    <QueryClientProvider client={queryClient}>
      <MemoryRouter initialEntries={[path]}>
        <Routes>
          <Route
            path="*"
            element={
              <>
                {ui}
                <CurrentPath />
              </>
            }
          />
        </Routes>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}
