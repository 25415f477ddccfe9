// Shows what an invitation is for and creates the invited person's account from name and password.
import {
  InvitationAcceptSchema,
  type InvitationPreview,
  type SessionUser,
} from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { FormTextField } from '../../../components/ui/form-controls';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { formatDate, roleName } from '../../../lib/format';
import { useAcceptInvitation } from '../api/invitation';

const ROLE_DUTIES = {
  admin: 'manage the network’s accounts and settings',
  coordinator: 'design trials, enrol sites and publish reports',
  grower: 'sow rate strips in your own field and record what they yield',
  member: 'read the network’s published trial reports',
} as const;

export function AcceptInvitationForm({
  token,
  invitation,
  onAccepted,
}: {
  token: string;
  invitation: InvitationPreview;
  onAccepted: (user: SessionUser) => void;
}) {
  const accept = useAcceptInvitation();
  const form = useZodForm(InvitationAcceptSchema, {
    defaultValues: { token, name: '', password: '' },
  });

  return (
    <div className="space-y-6">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 rounded-field bg-sunken p-4 text-label">
        <dt className="text-ink-muted">Network</dt>
        <dd className="font-semibold text-ink">{invitation.networkName}</dd>
        <dt className="text-ink-muted">Role</dt>
        <dd className="text-ink">
          <span className="font-semibold">{roleName(invitation.role)}</span>
          <span className="block text-caption text-ink-muted">
            You will {ROLE_DUTIES[invitation.role]}.
          </span>
        </dd>
        <dt className="text-ink-muted">E-mail</dt>
        <dd className="break-all text-ink">{invitation.email}</dd>
        <dt className="text-ink-muted">Open until</dt>
        <dd className="text-ink">{formatDate(invitation.expiresAt)}</dd>
      </dl>
      <Form
        form={form}
        onSubmit={(input) =>
          accept.mutate(input, {
            onSuccess: onAccepted,
            onError: (error) => applyServerErrors(form, error),
          })
        }
        className="space-y-5"
      >
        {accept.error ? <Alert tone="danger">{errorSummary(accept.error)}</Alert> : null}
        <FormTextField
          name="name"
          label="Your name"
          hint="As the network knows you; shown on the sites you grow."
          autoComplete="name"
          required
        />
        <FormTextField
          name="password"
          label="Choose a password"
          type="password"
          autoComplete="new-password"
          hint="At least 8 characters."
          required
        />
        <Button type="submit" size="lg" className="w-full" busy={accept.isPending}>
          Join {invitation.networkName}
        </Button>
      </Form>
    </div>
  );
}
