// "Invite someone": an e-mail address and a role the viewer may grant; the person gets a link.
import { useState } from 'react';
import { InvitationCreateSchema } from '../../../../shared/schemas/auth';
import type { Role } from '../../../../shared/schemas/common';
import { grantableRoles } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { FormSelectField, FormTextField } from '../../../components/ui/form-controls';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { roleName } from '../../../lib/format';
import { useInvite } from '../api/people';

export function InviteForm({ networkId, viewerRole }: { networkId: string; viewerRole: Role }) {
  const invite = useInvite(networkId);
  const roles = grantableRoles(viewerRole);
  const form = useZodForm(InvitationCreateSchema, {
    defaultValues: { email: '', role: 'grower' },
  });
  const [sent, setSent] = useState<string | null>(null);

  return (
    <Form
      form={form}
      onSubmit={(input) => {
        setSent(null);
        invite.mutate(input, {
          onSuccess: (created) => {
            setSent(`An invitation went to ${created.email}.`);
            form.reset({ email: '', role: input.role });
          },
          onError: (error) => applyServerErrors(form, error),
        });
      }}
      className="space-y-4"
      aria-label="Invite someone"
    >
      {invite.isError ? <Alert tone="danger">{errorSummary(invite.error)}</Alert> : null}
      {sent ? <Alert tone="success">{sent}</Alert> : null}
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <FormTextField name="email" label="E-mail" type="email" autoComplete="off" required />
        <FormSelectField name="role" label="Role">
          {roles.map((r) => (
            <option key={r} value={r}>
              {roleName(r)}
            </option>
          ))}
        </FormSelectField>
      </div>
      <Button type="submit" busy={invite.isPending}>
        Send invitation
      </Button>
    </Form>
  );
}
