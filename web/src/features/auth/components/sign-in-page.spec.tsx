import type { SignupStatusResponse } from '@domain/signup/signup.schema';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';

import { buildSessionResponse, buildSessionUser } from '../../../testing/data';
import { apiErrorResponse, mockApi } from '../../../testing/mock-api';
import { jsonResponse } from '../../../testing/render-app';
import { safeNextPath } from '../utils/safe-next-path';

import { checkSignInFields, goOnIfSignedIn, SignInPage } from './sign-in-page';

const office = buildSessionUser('office');
const openStatus: SignupStatusResponse = { mode: 'open', hasCompanies: true, mailCaptured: true, contact: null };

/** The sign-in page (sign-in.html) as sign-in-main.tsx starts it, with a spy for the full page load. */
function renderSignIn({ next = '/', expired = false, status = Promise.resolve(openStatus) }: { next?: string; expired?: boolean; status?: Promise<SignupStatusResponse> } = {}) {
  const go = vi.fn<(url: string) => void>();
  const user = userEvent.setup();
  render(<SignInPage next={next} expired={expired} signupStatus={status} go={go} />);
  return { user, go };
}

describe('the sign-in page', () => {
  it('should say which boxes are empty or wrong without asking the server', async () => {
    const fetchMock = mockApi({});
    const { user } = renderSignIn();

    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(screen.getByText('Enter your e-mail address.')).toBeInTheDocument();
    expect(screen.getByText('Enter your password.')).toBeInTheDocument();
    expect(screen.getByLabelText(/^E-mail/)).toHaveAttribute('aria-invalid', 'true');

    await user.type(screen.getByLabelText(/^E-mail/), 'not-an-address');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(screen.getByText('Must be an e-mail address.')).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('should check addresses as the server’s schema does (zod’s e-mail rule), without zod', () => {
    expect(checkSignInFields(' Office@Fernhollow.example ', 'x')).toEqual({});
    expect(checkSignInFields('a.b+c@crew-1.fernhollow.example', 'x')).toEqual({});
    for (const wrong of ['office@fernhollow', '.office@fernhollow.example', 'of..fice@fernhollow.example', 'office@-x.example', 'office fernhollow.example']) {
      expect(checkSignInFields(wrong, 'x'), wrong).toEqual({ email: 'Must be an e-mail address.' });
    }
    expect(checkSignInFields('office@fernhollow.example', 'x'.repeat(201))).toEqual({ password: 'Must be at most 200 characters.' });
  });

  it('should keep the fields as the app had them: labels, autocomplete, a password that can be shown', async () => {
    mockApi({});
    const { user } = renderSignIn();
    const email = screen.getByLabelText(/^E-mail/);
    expect(email).toHaveAttribute('type', 'email');
    expect(email).toHaveAttribute('autocomplete', 'username');
    expect(email).toHaveAttribute('inputmode', 'email');
    expect(email).toHaveAttribute('autocapitalize', 'none');
    const password = screen.getByLabelText(/^Password/);
    expect(password).toHaveAttribute('type', 'password');
    expect(password).toHaveAttribute('autocomplete', 'current-password');

    await user.click(screen.getByRole('button', { name: 'Show password' }));
    expect(password).toHaveAttribute('type', 'text');
    expect(screen.getByRole('button', { name: 'Hide password' })).toHaveAttribute('aria-pressed', 'true');
  });

  it('should sign in, then load the app at `next` (the app restores the session from the cookie)', async () => {
    let answer!: (response: Response) => void;
    const fetchMock = mockApi({ 'POST /api/auth/sign-in': () => new Promise<Response>((resolve) => (answer = resolve)) });
    const { user, go } = renderSignIn({ next: '/users' });

    await user.type(screen.getByLabelText(/^E-mail/), '  Office@Fernhollow.example ');
    await user.type(screen.getByLabelText(/^Password/), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    // Pending: one request, the button says so and takes no second press.
    const pending = await screen.findByRole('button', { name: 'Signing in…' });
    expect(pending).toBeDisabled();
    answer(jsonResponse(buildSessionResponse(office, 'fresh-token')));
    await waitFor(() => expect(go).toHaveBeenCalledWith('/users'));

    const [, init] = fetchMock.mock.calls.find(([url]) => url === '/api/auth/sign-in')!;
    expect(init?.method).toBe('POST');
    expect(init?.credentials).toBe('include');
    expect(new Headers(init?.headers).get('Content-Type')).toBe('application/json');
    expect(new Headers(init?.headers).has('Authorization')).toBe(false);
    expect(JSON.parse(String(init?.body))).toEqual({ email: 'office@fernhollow.example', password: 'correct horse battery' });
  });

  it('should go home, not to a `next` that leaves the app', () => {
    // sign-in-main.tsx passes safeNextPath(?next) to the page.
    expect(safeNextPath('//evil.example/')).toBe('/');
    expect(safeNextPath('https://evil.example/')).toBe('/');
    expect(safeNextPath('/sign-in?next=/users')).toBe('/');
    expect(safeNextPath('/jobs/4f1c?section=runs')).toBe('/jobs/4f1c?section=runs');
  });

  it.each([
    ['a refused password', () => apiErrorResponse(401, { message: 'E-mail or password is wrong.', code: 'SIGN_IN_FAILED' }), /do not match an account that can sign in/],
    ['too many attempts', () => apiErrorResponse(429, { message: 'Too many sign-in attempts. Try again in a few minutes' }), /^Too many sign-in attempts\. Try again in a few minutes\.$/],
    ['no answer', () => Promise.reject(new TypeError('Failed to fetch')), /Cannot reach the server\. Check your connection and try again\./],
  ] as const)('should explain %s in one message', async (_case, reply, message) => {
    mockApi({ 'POST /api/auth/sign-in': reply });
    const { user, go } = renderSignIn();

    await user.type(screen.getByLabelText(/^E-mail/), 'office@fernhollow.example');
    await user.type(screen.getByLabelText(/^Password/), 'wrong password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText(message)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Sign in' })).toBeEnabled();
    expect(go).not.toHaveBeenCalled();
  });

  it('should show the server’s field issues on the fields', async () => {
    mockApi({
      'POST /api/auth/sign-in': () =>
        apiErrorResponse(400, { message: 'Validation failed', code: 'VALIDATION_FAILED', issues: [{ path: 'email', message: 'is not accepted here' }] }),
    });
    const { user } = renderSignIn();

    await user.type(screen.getByLabelText(/^E-mail/), 'office@fernhollow.example');
    await user.type(screen.getByLabelText(/^Password/), 'a password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('Is not accepted here.')).toBeInTheDocument();
  });

  it('should carry the typed address to “Forgot your password?”', async () => {
    mockApi({});
    const { user } = renderSignIn();
    expect(screen.getByRole('link', { name: 'Forgot your password?' })).toHaveAttribute('href', '/forgot-password');
    await user.type(screen.getByLabelText(/^E-mail/), ' lead@fernhollow.example ');
    expect(screen.getByRole('link', { name: 'Forgot your password?' })).toHaveAttribute('href', '/forgot-password?email=lead%40fernhollow.example');
  });

  it('should say the session ended when the app sent the user here for that', () => {
    mockApi({});
    renderSignIn({ expired: true });
    expect(screen.getByText('Your session ended. Sign in again to carry on where you were.')).toBeInTheDocument();
  });

  it('should point to sign-up when no company exists yet, or offer one beside the form', async () => {
    mockApi({});
    renderSignIn({ status: Promise.resolve({ ...openStatus, hasCompanies: false }) });
    expect(await screen.findByText('No company exists on this server yet.')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Create the first company' })).toHaveAttribute('href', '/sign-up');
    expect(screen.queryByRole('link', { name: 'Create a company' })).not.toBeInTheDocument();
  });

  it('should offer a company beside the form while sign-up is open, and nothing while it is closed', async () => {
    mockApi({});
    const { unmount } = render(<SignInPage next="/" expired={false} signupStatus={Promise.resolve(openStatus)} go={vi.fn()} />);
    expect(await screen.findByRole('link', { name: 'Create a company' })).toHaveAttribute('href', '/sign-up');
    unmount();

    renderSignIn({ status: Promise.resolve({ ...openStatus, mode: 'closed', hasCompanies: false }) });
    expect(await screen.findByText(/Its operator creates companies/)).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: /Create/ })).not.toBeInTheDocument();
  });

  it('should send someone already signed in straight on, and leave anyone else on the form', async () => {
    const go = vi.fn<(url: string) => void>();
    mockApi({ 'POST /api/auth/refresh': () => jsonResponse(buildSessionResponse(office)) });
    await goOnIfSignedIn('/jobs', go);
    expect(go).toHaveBeenCalledWith('/jobs');

    go.mockClear();
    mockApi({ 'POST /api/auth/refresh': () => apiErrorResponse(401, { message: 'No session.', code: 'SESSION_ENDED' }) });
    await goOnIfSignedIn('/jobs', go);
    // With no signal nobody can tell: the form stays.
    mockApi({ 'POST /api/auth/refresh': () => Promise.reject(new TypeError('Failed to fetch')) });
    await goOnIfSignedIn('/jobs', go);
    expect(go).not.toHaveBeenCalled();
  });
});
