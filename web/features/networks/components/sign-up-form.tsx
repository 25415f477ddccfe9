// Sign up and start a network: name, e-mail, password and the network's name; then a link by e-mail.
import { useState, type FormEvent } from 'react';
import { SignUpInputSchema } from '../../../../shared/schemas/network';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import {
  apiFieldErrors,
  errorSummary,
  zodFieldErrors,
  type FieldErrors,
} from '../../../lib/form-errors';
import { useSignUp } from '../api/networks';

export function SignUpForm() {
  const signUp = useSignUp();
  const [values, setValues] = useState({ name: '', email: '', password: '', networkName: '' });
  const [fieldErrors, setFieldErrors] = useState<FieldErrors>({});
  const set = (key: keyof typeof values) => (e: { target: { value: string } }) =>
    setValues((v) => ({ ...v, [key]: e.target.value }));

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = SignUpInputSchema.safeParse(values);
    if (!parsed.success) {
      setFieldErrors(zodFieldErrors(parsed.error));
      return;
    }
    setFieldErrors({});
    signUp.mutate(parsed.data, { onError: (error) => setFieldErrors(apiFieldErrors(error)) });
  }

  if (signUp.isSuccess) {
    return (
      <Alert tone="success" title="Check your inbox">
        We sent a link to <strong>{values.email}</strong>. Open it within 48 hours to confirm the
        address; Sheaf then starts “{values.networkName}” with you as its admin.
      </Alert>
    );
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-5" data-testid="sign-up-form">
      {signUp.error ? <Alert tone="danger">{errorSummary(signUp.error)}</Alert> : null}
      <TextField
        label="Your name"
        autoComplete="name"
        required
        value={values.name}
        onChange={set('name')}
        error={fieldErrors.name}
      />
      <TextField
        label="E-mail address"
        type="email"
        inputMode="email"
        autoComplete="email"
        autoCapitalize="none"
        spellCheck={false}
        required
        value={values.email}
        onChange={set('email')}
        error={fieldErrors.email}
      />
      <TextField
        label="Password (at least 8 characters)"
        type="password"
        autoComplete="new-password"
        required
        value={values.password}
        onChange={set('password')}
        error={fieldErrors.password}
      />
      <TextField
        label="Name of your network"
        hint="The group of growers you run trials with, e.g. “Ridge Grain Circle”."
        required
        value={values.networkName}
        onChange={set('networkName')}
        error={fieldErrors.networkName}
      />
      <Button type="submit" size="lg" className="w-full" busy={signUp.isPending}>
        Send me the confirmation link
      </Button>
    </form>
  );
}
