// Asks for a password-reset link; always answers the same way so addresses cannot be probed.
import { useState, type FormEvent } from 'react';
import { PasswordResetRequestSchema } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { errorSummary, zodFieldErrors, type FieldErrors } from '../../../lib/form-errors';
import { useRequestPasswordReset } from '../api/password-reset';

export function RequestResetForm() {
  const reset = useRequestPasswordReset();
  const [email, setEmail] = useState('');
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = PasswordResetRequestSchema.safeParse({ email });
    if (!parsed.success) {
      setFieldErrors(zodFieldErrors(parsed.error));
      return;
    }
    setFieldErrors({});
    reset.mutate(parsed.data);
  }

  if (reset.isSuccess) {
    return (
      <Alert tone="success" title="Check your inbox">
        If <strong>{email}</strong> has a Sheaf account, a link to set a new password is on its way.
        The link works for a limited time; ask again if it runs out.
      </Alert>
    );
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      {reset.error ? <Alert tone="danger">{errorSummary(reset.error)}</Alert> : null}
      <TextField
        label="E-mail address"
        type="email"
        inputMode="email"
        autoComplete="email"
        autoCapitalize="none"
        spellCheck={false}
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        error={fieldErrors.email}
      />
      <Button type="submit" size="lg" className="w-full" busy={reset.isPending}>
        Send me a link
      </Button>
    </form>
  );
}
