import { fireEvent, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { NavMenu } from '../src/app/NavMenu';
import { navigationLayout } from '../src/app/navigation';
import type { Me } from '../src/lib/api/types';

const lead: Me = {
  id: 1,
  email: 'imogen.varley@ostrevale.example',
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  regionName: 'Ostrevale',
  practices: [],
  sessionExpiresAt: '2026-12-01T18:00:00.000Z',
};

function renderMenu(path: string) {
  const group = navigationLayout(lead).find((e) => e.kind === 'group' && e.label === 'Admin')!;
  if (group.kind !== 'group') throw new Error('no menu');
  const element = (
    <nav aria-label="Main">
      <NavMenu label={group.label} items={group.items} />
      <a href="#elsewhere">Elsewhere</a>
    </nav>
  );
  const router = createMemoryRouter(
    [
      { path: '/', element },
      { path: '*', element },
    ],
    { initialEntries: [path] },
  );
  return { router, ...render(<RouterProvider router={router} />) };
}

describe('the navigation bar’s Admin menu', () => {
  it('is a button that says whether its list of links is shown', async () => {
    renderMenu('/');
    const button = screen.getByRole('button', { name: 'Admin' });
    expect(button.getAttribute('aria-expanded')).toBe('false');
    expect(screen.queryByRole('link', { name: 'Users' })).toBeNull();
    await userEvent.click(button);
    expect(button.getAttribute('aria-expanded')).toBe('true');
    expect(document.getElementById(button.getAttribute('aria-controls')!)).toBeTruthy();
    expect(screen.getAllByRole('link').map((a) => a.textContent)).toEqual([
      'Users',
      'Mail',
      'Audit trail',
      'Elsewhere',
    ]);
  });

  it('works from the keyboard: Enter opens, Tab reaches the links, Escape closes and returns to the button', async () => {
    renderMenu('/');
    const user = userEvent.setup();
    await user.tab();
    const button = screen.getByRole('button', { name: 'Admin' });
    expect(document.activeElement).toBe(button);
    await user.keyboard('{Enter}');
    expect(button.getAttribute('aria-expanded')).toBe('true');
    await user.tab();
    expect(document.activeElement).toBe(screen.getByRole('link', { name: 'Users' }));
    await user.keyboard('{Escape}');
    expect(button.getAttribute('aria-expanded')).toBe('false');
    expect(document.activeElement).toBe(button);
  });

  it('closes when focus or a click leaves it, and when a link is followed', async () => {
    const { router } = renderMenu('/');
    const button = screen.getByRole('button', { name: 'Admin' });
    await userEvent.click(button);
    fireEvent.mouseDown(document.body);
    expect(button.getAttribute('aria-expanded')).toBe('false');
    await userEvent.click(button);
    await userEvent.click(screen.getByRole('link', { name: 'Mail' }));
    expect(router.state.location.pathname).toBe('/deliveries');
    expect(button.getAttribute('aria-expanded')).toBe('false');
  });

  it('marks the page shown, and itself as the current section', () => {
    renderMenu('/mail-recipients');
    const button = screen.getByRole('button', { name: 'Admin' });
    expect(button.className).toContain('active');
    fireEvent.click(button);
    expect(screen.getByRole('link', { name: 'Mail' }).getAttribute('aria-current')).toBe('page');
    expect(screen.getByRole('link', { name: 'Users' }).getAttribute('aria-current')).toBeNull();
  });
});
