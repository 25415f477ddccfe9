// Asks for a password-reset link; always answers the same way so addresses cannot be probed.
import { PasswordResetRequestSchema } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { FormTextField } from '../../../components/ui/form-controls';
import { errorSummary } from '../../../lib/form-errors';
import { Form, useZodForm } from '../../../lib/forms/zod-form';
import { useRequestPasswordReset } from '../api/password-reset';

export function RequestResetForm() {
  const reset = useRequestPasswordReset();
  const form = useZodForm(PasswordResetRequestSchema, { defaultValues: { email: '' } });

  if (reset.isSuccess) {
    return (
      <Alert tone="success" title="Check your inbox">
        If <strong>{reset.variables.email}</strong> has a Sheaf account, a link to set a new
        password is on its way. The link works for a limited time; ask again if it runs out.
      </Alert>
    );
  }

  return (
    <Form form={form} onSubmit={(input) => reset.mutate(input)} className="space-y-5">
      {reset.error ? <Alert tone="danger">{errorSummary(reset.error)}</Alert> : null}
      <FormTextField
        name="email"
        label="E-mail address"
        type="email"
        inputMode="email"
        autoComplete="email"
        autoCapitalize="none"
        spellCheck={false}
        required
      />
      <Button type="submit" size="lg" className="w-full" busy={reset.isPending}>
        Send me a link
      </Button>
    </Form>
  );
}
