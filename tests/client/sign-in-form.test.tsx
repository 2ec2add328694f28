import { cleanup, fireEvent, screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SignInForm } from '../../src/features/auth/components/sign-in-form';
import { renderWithProviders } from './render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function fill(label: string, value: string) {
  fireEvent.change(screen.getByLabelText(label), { target: { value } });
}

describe('sign-in form', () => {
  it('shows the shared schema’s messages inline and sends nothing when fields are invalid', async () => {
    const fetchSpy = vi.fn();
    vi.stubGlobal('fetch', fetchSpy);
    renderWithProviders(<SignInForm onSignedIn={() => undefined} />);
    fill('E-mail', 'not-an-address');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(
      await screen.findByText('Enter a valid e-mail address, like name@example.com.'),
    ).toBeTruthy();
    expect(screen.getByText('Enter your password.')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(fetchSpy).not.toHaveBeenCalled();
  });

  it('shows the server’s refusal and keeps what was typed', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(
        async () =>
          new Response(
            JSON.stringify({
              error: {
                code: 'wrong_credentials',
                message: 'That e-mail and password do not match.',
              },
            }),
            { status: 401, headers: { 'Content-Type': 'application/json' } },
          ),
      ),
    );
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);
    fill('E-mail', 'ines@northlight.example');
    fill('Password', 'wrong one');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('That e-mail and password do not match.')).toBeTruthy();
    expect((screen.getByLabelText('E-mail') as HTMLInputElement).value).toBe(
      'ines@northlight.example',
    );
    expect(onSignedIn).not.toHaveBeenCalled();
  });

  it('sends trimmed, case-folded e-mail as JSON and reports success', async () => {
    const fetchSpy = vi.fn(
      async (_url: string, _init?: RequestInit) =>
        new Response(
          JSON.stringify({
            user: {
              kind: 'staff',
              id: 'u1',
              role: 'photographer',
              displayName: 'Tomas Reyne',
              email: 'tomas@northlight.example',
              clientId: null,
              clientName: null,
              officeName: null,
            },
            expiresAt: new Date().toISOString(),
          }),
          { status: 201, headers: { 'Content-Type': 'application/json' } },
        ),
    );
    vi.stubGlobal('fetch', fetchSpy);
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);
    fill('E-mail', '  Tomas@Northlight.example ');
    fill('Password', 'northlight-demo');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(onSignedIn).toHaveBeenCalled());
    const [url, init] = fetchSpy.mock.calls[0] ?? [];
    expect(url).toBe('/api/session');
    expect(JSON.parse(String(init?.body))).toEqual({
      email: 'tomas@northlight.example',
      password: 'northlight-demo',
    });
  });
});
