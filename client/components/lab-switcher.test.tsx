import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, screen, within } from '@testing-library/react';
import { AppShell } from './app-shell.tsx';
import { renderWithProviders } from './test-harness.tsx';
import type { SwitcherLab } from './lab-switcher.tsx';

afterEach(cleanup);

const LABS: SwitcherLab[] = [
  { slug: 'fernhollow', name: 'Fernhollow Field Station', role: 'admin' },
  { slug: 'saltmarsh', name: 'Saltmarsh Survey', role: 'guest' },
];

function renderShell(url: string, labs = LABS) {
  return renderWithProviders(
    [
      {
        path: '/labs/:lab/*',
        element: (
          <AppShell userName="Odalys Brennick" labs={labs} onSignOut={() => {}}>
            page
          </AppShell>
        ),
      },
      {
        path: '*',
        element: (
          <AppShell userName="Odalys Brennick" labs={labs} onSignOut={() => {}}>
            page
          </AppShell>
        ),
      },
    ],
    url,
  );
}

describe('LabSwitcher in the app shell', () => {
  it('names the lab in the URL and lists every lab as a link, plus Create a lab', () => {
    renderShell('/labs/saltmarsh/members');
    const toggle = screen.getByRole('button', { name: /Saltmarsh Survey/ });
    expect(toggle.getAttribute('aria-expanded')).toBe('false');
    fireEvent.click(toggle);
    expect(toggle.getAttribute('aria-expanded')).toBe('true');
    const list = screen.getByRole('list', { name: 'Your labs' });
    const links = within(list).getAllByRole('link');
    expect(links.map((a) => [a.getAttribute('href'), a.getAttribute('aria-current')])).toEqual([
      ['/labs/fernhollow', null],
      ['/labs/saltmarsh', 'page'],
    ]);
    expect(links[1].textContent).toContain('Guest');
    expect(screen.getByRole('link', { name: '+ Create a lab' }).getAttribute('href')).toBe('/labs/new');
  });

  it('closes on Escape and gives focus back to its button', () => {
    renderShell('/');
    const toggle = screen.getByRole('button', { name: /Go to a lab/ });
    fireEvent.click(toggle);
    fireEvent.keyDown(screen.getByRole('link', { name: /Fernhollow/ }), { key: 'Escape' });
    expect(toggle.getAttribute('aria-expanded')).toBe('false');
    expect(document.activeElement).toBe(toggle);
    expect(screen.queryByRole('list', { name: 'Your labs' })).toBeNull();
  });

  it('navigates to the chosen lab', async () => {
    const { router } = renderShell('/');
    fireEvent.click(screen.getByRole('button', { name: /Go to a lab/ }));
    fireEvent.click(screen.getByRole('link', { name: /Saltmarsh Survey/ }));
    expect(router.state.location.pathname).toBe('/labs/saltmarsh');
    expect(await screen.findByRole('button', { name: /Saltmarsh Survey/ })).toBeTruthy();
  });

  it('on a page of no lab names that page and offers the labs to go to, never "Choose a lab"', () => {
    for (const [url, place] of [
      ['/account', 'Your account'],
      ['/api-reference', 'API reference'],
      ['/', 'Start page'],
      ['/labs/new', 'New lab'],
    ]) {
      renderShell(url);
      const toggle = screen.getByRole('button', { name: /Go to a lab/ });
      expect(toggle.textContent).toBe(`${place}Go to a lab▾`);
      fireEvent.click(toggle);
      const links = within(screen.getByRole('list', { name: 'Your labs' })).getAllByRole('link');
      expect(links.map((a) => a.getAttribute('aria-current'))).toEqual([null, null]);
      expect(document.body.textContent).not.toContain('Choose a lab');
      cleanup();
    }
  });

  it('says so when the lab in the address is not one of the person’s labs', () => {
    renderShell('/labs/elsewhere/loggers');
    expect(screen.getByRole('button', { name: /Go to a lab/ }).textContent).toBe('Not one of your labsGo to a lab▾');
  });

  it('still offers Create a lab to someone with no lab', () => {
    renderShell('/', []);
    fireEvent.click(screen.getByRole('button', { name: /No lab yet/ }));
    expect(screen.getByRole('link', { name: '+ Create a lab' })).toBeTruthy();
  });
});
