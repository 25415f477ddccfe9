// E-mail and password form that signs a user in and hands the session user to the caller.
import { Link } from 'react-router-dom';
import { LoginInputSchema, type SessionUser } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { FormTextField } from '../../../components/ui/form-controls';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { useLogin } from '../api/login';

export function SignInForm({ onSignedIn }: { onSignedIn: (user: SessionUser) => void }) {
  const login = useLogin();
  const form = useZodForm(LoginInputSchema, { defaultValues: { email: '', password: '' } });

  const wrongPassword = isApiError(login.error, 401);
  return (
    <Form
      form={form}
      onSubmit={(input) =>
        login.mutate(input, {
          onSuccess: onSignedIn,
          onError: (error) => applyServerErrors(form, error),
        })
      }
      className="space-y-5"
    >
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
      <FormTextField
        name="email"
        label="E-mail address"
        type="email"
        inputMode="email"
        autoComplete="username"
        autoCapitalize="none"
        spellCheck={false}
        required
      />
      <FormTextField
        name="password"
        label="Password"
        type="password"
        autoComplete="current-password"
        required
      />
      <Button type="submit" size="lg" className="w-full" busy={login.isPending}>
        {login.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
      <p className="text-center text-label">
        <Link to="/reset" className="text-accent underline">
          Forgot your password?
        </Link>
      </p>
    </Form>
  );
}
