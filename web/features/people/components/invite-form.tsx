// "Invite someone": an e-mail address and a role the viewer may grant; the person gets a link.
import { useState, type FormEvent } from 'react';
import { InvitationCreateSchema } from '../../../../shared/schemas/auth';
import type { Role } from '../../../../shared/schemas/common';
import { grantableRoles } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/form-fields';
import { TextField } from '../../../components/ui/text-field';
import {
  apiFieldErrors,
  errorSummary,
  zodFieldErrors,
  type FieldErrors,
} from '../../../lib/form-errors';
import { roleName } from '../../../lib/format';
import { useInvite } from '../api/people';

export function InviteForm({ networkId, viewerRole }: { networkId: string; viewerRole: Role }) {
  const invite = useInvite(networkId);
  const roles = grantableRoles(viewerRole);
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('grower');
  const [errors, setErrors] = useState<FieldErrors>({});
  const [sent, setSent] = useState<string | null>(null);

  async function submit(event: FormEvent) {
    event.preventDefault();
    setSent(null);
    const parsed = InvitationCreateSchema.safeParse({ email, role });
    if (!parsed.success) {
      setErrors(zodFieldErrors(parsed.error));
      return;
    }
    setErrors({});
    try {
      const created = await invite.mutateAsync(parsed.data);
      setSent(`An invitation went to ${created.email}.`);
      setEmail('');
    } catch (error) {
      setErrors(apiFieldErrors(error));
    }
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Invite someone">
      {invite.isError ? <Alert tone="danger">{errorSummary(invite.error)}</Alert> : null}
      {sent ? <Alert tone="success">{sent}</Alert> : null}
      <div className="grid gap-4 sm:grid-cols-[2fr_1fr]">
        <TextField
          label="E-mail"
          type="email"
          autoComplete="off"
          required
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          error={errors.email}
        />
        <SelectField
          label="Role"
          value={role}
          onChange={(e) => setRole(e.target.value as Role)}
          error={errors.role}
        >
          {roles.map((r) => (
            <option key={r} value={r}>
              {roleName(r)}
            </option>
          ))}
        </SelectField>
      </div>
      <Button type="submit" busy={invite.isPending}>
        Send invitation
      </Button>
    </form>
  );
}
