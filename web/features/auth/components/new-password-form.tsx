// Sets a new password from the token in a reset link.
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { PasswordResetCompleteSchema } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import {
  apiFieldErrors,
  errorSummary,
  zodFieldErrors,
  type FieldErrors,
} from '../../../lib/form-errors';
import { useCompletePasswordReset } from '../api/password-reset';

export function NewPasswordForm({ token }: { token: string }) {
  const complete = useCompletePasswordReset();
  const [password, setPassword] = useState('');
  const [confirm, setConfirm] = useState('');
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = PasswordResetCompleteSchema.safeParse({ token, password });
    const errors = parsed.success ? {} : zodFieldErrors(parsed.error);
    if (password && confirm !== password) errors.confirm = 'The two passwords differ';
    if (Object.keys(errors).length > 0 || !parsed.success) {
      setFieldErrors(errors);
      return;
    }
    setFieldErrors({});
    complete.mutate(parsed.data, { onError: (error) => setFieldErrors(apiFieldErrors(error)) });
  }

  if (complete.isSuccess) {
    return (
      <div className="space-y-5">
        <Alert tone="success" title="Password changed">
          Sign in with your new password.
        </Alert>
        <ButtonLink to="/sign-in" size="lg" className="w-full">
          Go to sign in
        </ButtonLink>
      </div>
    );
  }

  const linkProblem =
    fieldErrors.token ?? (isApiError(complete.error, 400) && !complete.error.fields.password);
  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      {linkProblem ? (
        <Alert tone="danger" title="This link no longer works">
          Reset links expire and work only once.{' '}
          <Link to="/reset" className="font-semibold underline">
            Ask for a new link
          </Link>
          .
        </Alert>
      ) : complete.error ? (
        <Alert tone="danger">{errorSummary(complete.error)}</Alert>
      ) : null}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 8 characters. A short sentence is easy to remember."
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={fieldErrors.password}
      />
      <TextField
        label="New password again"
        type="password"
        autoComplete="new-password"
        required
        value={confirm}
        onChange={(e) => setConfirm(e.target.value)}
        error={fieldErrors.confirm}
      />
      <Button type="submit" size="lg" className="w-full" busy={complete.isPending}>
        Save new password
      </Button>
    </form>
  );
}
