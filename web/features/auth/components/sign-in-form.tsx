// E-mail and password form that signs a user in and hands the session user to the caller.
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { LoginInputSchema, type SessionUser } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import {
  apiFieldErrors,
  errorSummary,
  zodFieldErrors,
  type FieldErrors,
} from '../../../lib/form-errors';
import { useLogin } from '../api/login';

export function SignInForm({ onSignedIn }: { onSignedIn: (user: SessionUser) => void }) {
  const login = useLogin();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = LoginInputSchema.safeParse({ email, password });
    if (!parsed.success) {
      setFieldErrors(zodFieldErrors(parsed.error));
      return;
    }
    setFieldErrors({});
    login.mutate(parsed.data, {
      onSuccess: onSignedIn,
      onError: (error) => setFieldErrors(apiFieldErrors(error)),
    });
  }

  const wrongPassword = isApiError(login.error, 401);
  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      {login.error ? (
        <Alert
          tone="danger"
          title={wrongPassword ? 'Those details did not match' : 'Could not sign in'}
        >
          {wrongPassword
            ? 'Check the e-mail address and password, or set a new password below.'
            : errorSummary(login.error)}
        </Alert>
      ) : null}
      <TextField
        label="E-mail address"
        type="email"
        name="email"
        inputMode="email"
        autoComplete="username"
        autoCapitalize="none"
        spellCheck={false}
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        error={fieldErrors.email}
      />
      <TextField
        label="Password"
        type="password"
        name="password"
        autoComplete="current-password"
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={fieldErrors.password}
      />
      <Button type="submit" size="lg" className="w-full" busy={login.isPending}>
        {login.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
      <p className="text-center text-label">
        <Link to="/reset" className="text-accent underline">
          Forgot your password?
        </Link>
      </p>
    </form>
  );
}
