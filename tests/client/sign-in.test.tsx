import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { routes } from '../../src/app/router.tsx';
import { resetCsrf } from '../../src/lib/api-client.ts';
import { mockFetch, renderRoutes } from './render.tsx';

afterEach(() => {
  vi.unstubAllGlobals();
  resetCsrf();
});

const inspector = { id: 7, email: 'inspector@example.test', name: 'Ina Spect', role: 'inspector' };

describe('sign-in page', () => {
  it('when the password is wrong, shows the server detail and keeps the e-mail', async () => {
    mockFetch((url) => {
      if (url === '/api/auth/me') return { status: 401, body: { type: 'x', title: 'Not signed in', status: 401, detail: 'Sign in to continue.' } };
      if (url === '/api/auth/csrf') return { status: 200, body: { csrfToken: 't' } };
      if (url === '/api/auth/login') return { status: 401, body: { type: 'x', title: 'Not signed in', status: 401, detail: 'The e-mail or password is not right.' } };
    });
    renderRoutes(routes, '/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'someone@example.test');
    await user.type(screen.getByLabelText('Password'), 'nope');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('The e-mail or password is not right.')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveValue('someone@example.test');
  });

  it('sends the CSRF token header with the login request', async () => {
    const fetchMock = mockFetch((url) => {
      if (url === '/api/auth/me') return { status: 401, body: { type: 'x', title: 'x', status: 401, detail: 'x' } };
      if (url === '/api/auth/csrf') return { status: 200, body: { csrfToken: 'tok-123' } };
      if (url === '/api/auth/login') return { status: 200, body: { user: inspector } };
    });
    renderRoutes(routes, '/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), inspector.email);
    await user.type(screen.getByLabelText('Password'), 'pw');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([u]) => u === '/api/auth/login')).toBe(true));
    const loginCall = fetchMock.mock.calls.find(([u]) => u === '/api/auth/login')!;
    expect((loginCall[1]!.headers as Record<string, string>)['x-csrf-token']).toBe('tok-123');
  });
});

describe('navigation by role', () => {
  it.each([
    ['inspector', ['Dock', 'Bench', 'Bins', 'Catalog']],
    ['buyer', ['Suppliers', 'Catalog']],
    ['assembler', ['Pairing', 'Bins', 'Catalog']],
    ['quality', ['Dock', 'Bench', 'Bins', 'Pairing', 'Suppliers', 'Catalog', 'Admin']],
  ])('a signed-in %s sees exactly %j', async (role, expected) => {
    mockFetch((url) => (url === '/api/auth/me' ? { status: 200, body: { user: { ...inspector, role } } } : undefined));
    renderRoutes(routes, '/');
    const nav = await screen.findByRole('navigation', { name: 'Areas' });
    const links = Array.from(nav.querySelectorAll('a')).map((a) => a.textContent);
    expect(links).toEqual(expected);
  });

  it('an anonymous visitor is sent to the sign-in page', async () => {
    mockFetch((url) => (url === '/api/auth/me' ? { status: 401, body: { type: 'x', title: 'x', status: 401, detail: 'x' } } : undefined));
    renderRoutes(routes, '/admin/users');
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
  });
});
