// @vitest-environment happy-dom
// Component tests for the small forms: messages come from the API's schemas, appear under the
// field, and focus moves to the first field in error; nothing is sent while a field is wrong.
import { cleanup, screen } from '@testing-library/react';
import { createElement } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { AcceptInvitationForm } from '../../web/features/auth/components/accept-invitation-form';
import { NewPasswordForm } from '../../web/features/auth/components/new-password-form';
import { RequestResetForm } from '../../web/features/auth/components/request-reset-form';
import { SignInForm } from '../../web/features/auth/components/sign-in-form';
import { InviteForm } from '../../web/features/people/components/invite-form';
import { EnrolSiteForm } from '../../web/features/trials/components/enrol-site-form';
import { refuseFetch, renderWithProviders } from './render';

afterEach(cleanup);

describe('SignInForm', () => {
  it('names both empty fields and moves focus to the e-mail box', async () => {
    const fetches = refuseFetch();
    const { user } = renderWithProviders(createElement(SignInForm, { onSignedIn: () => {} }));
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(document.activeElement).toBe(screen.getByLabelText(/E-mail address/));
    expect(fetches.calls).toEqual([]);
  });

  it('clears the e-mail message as soon as the address is valid', async () => {
    refuseFetch();
    const { user } = renderWithProviders(createElement(SignInForm, { onSignedIn: () => {} }));
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await screen.findByText('Enter a valid e-mail address');
    await user.type(screen.getByLabelText(/E-mail address/), 'grower@example.test');
    expect(screen.queryByText('Enter a valid e-mail address')).toBeNull();
  });
});

describe('RequestResetForm', () => {
  it('refuses an address without an @', async () => {
    const fetches = refuseFetch();
    const { user } = renderWithProviders(createElement(RequestResetForm));
    await user.type(screen.getByLabelText(/E-mail address/), 'not-an-address');
    await user.click(screen.getByRole('button', { name: 'Send me a link' }));
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(fetches.calls).toEqual([]);
  });
});

describe('NewPasswordForm', () => {
  it('says when the two passwords differ and focuses the second box', async () => {
    refuseFetch();
    const { user } = renderWithProviders(
      createElement(NewPasswordForm, { token: 'a-long-enough-token' }),
    );
    await user.type(screen.getByLabelText(/^New password\*?$/), 'harvest-moon-27');
    await user.type(screen.getByLabelText(/New password again/), 'harvest-moon-28');
    await user.click(screen.getByRole('button', { name: 'Save new password' }));
    expect(await screen.findByText('The two passwords differ')).toBeTruthy();
    expect(document.activeElement).toBe(screen.getByLabelText(/New password again/));
  });

  it('asks for at least 8 characters, the API’s rule', async () => {
    refuseFetch();
    const { user } = renderWithProviders(
      createElement(NewPasswordForm, { token: 'a-long-enough-token' }),
    );
    await user.type(screen.getByLabelText(/^New password\*?$/), 'short');
    await user.click(screen.getByRole('button', { name: 'Save new password' }));
    expect(await screen.findByText('Use at least 8 characters')).toBeTruthy();
  });
});

describe('AcceptInvitationForm', () => {
  it('asks for a name and a password', async () => {
    refuseFetch();
    const { user } = renderWithProviders(
      createElement(AcceptInvitationForm, {
        token: 'a-long-enough-token',
        invitation: {
          email: 'new@example.test',
          role: 'grower',
          networkName: 'Invented Network',
          expiresAt: '2027-01-01T00:00:00.000Z',
        },
        onAccepted: () => {},
      }),
    );
    await user.click(screen.getByRole('button', { name: /Join Invented Network/ }));
    expect(await screen.findByText('Enter your name')).toBeTruthy();
    expect(screen.getByText('Use at least 8 characters')).toBeTruthy();
    expect(document.activeElement).toBe(screen.getByLabelText(/Your name/));
  });
});

describe('InviteForm', () => {
  it('offers a coordinator only the roles a coordinator may grant', () => {
    refuseFetch();
    renderWithProviders(createElement(InviteForm, { networkId: 'n', viewerRole: 'coordinator' }));
    const options = [...screen.getByLabelText('Role').querySelectorAll('option')].map(
      (o) => o.textContent,
    );
    expect(options).toEqual(['Grower', 'Member']);
  });

  it('refuses an empty address', async () => {
    const fetches = refuseFetch();
    const { user } = renderWithProviders(
      createElement(InviteForm, { networkId: 'n', viewerRole: 'coordinator' }),
    );
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(fetches.calls).toEqual([]);
  });
});

describe('EnrolSiteForm', () => {
  it('asks for the grower and the field name before sending', async () => {
    const fetches = refuseFetch();
    const { user } = renderWithProviders(createElement(EnrolSiteForm, { trialId: 't' }));
    await user.click(screen.getByRole('button', { name: 'Enrol site' }));
    expect(await screen.findByText('Choose the grower')).toBeTruthy();
    expect(screen.getByText('Name the field')).toBeTruthy();
    // Only the people list was asked for; nothing was posted.
    expect(fetches.calls.every((url) => url.endsWith('/people'))).toBe(true);
  });

  it('asks for an e-mail address when inviting', async () => {
    refuseFetch();
    const { user } = renderWithProviders(createElement(EnrolSiteForm, { trialId: 't' }));
    await user.click(screen.getByLabelText('Invite by e-mail'));
    await user.type(screen.getByLabelText(/Field name/), 'North field');
    await user.click(screen.getByRole('button', { name: 'Enrol site' }));
    expect(await screen.findByText('Enter the grower’s e-mail address')).toBeTruthy();
  });
});
