// Sets a new password from the token in a reset link.
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { PasswordResetCompleteSchema } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { FormTextField } from '../../../components/ui/form-controls';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { applyServerErrors, Form, useZodForm } from '../../../lib/forms/zod-form';
import { useCompletePasswordReset } from '../api/password-reset';

/** The API's schema plus the second password box, which must match the first. */
const NewPasswordFormSchema = PasswordResetCompleteSchema.extend({ confirm: z.string() })
  .refine((v) => v.confirm === v.password, {
    message: 'The two passwords differ',
    path: ['confirm'],
  })
  .transform(({ token, password }) => ({ token, password }));

export function NewPasswordForm({ token }: { token: string }) {
  const complete = useCompletePasswordReset();
  const form = useZodForm(NewPasswordFormSchema, {
    defaultValues: { token, password: '', confirm: '' },
  });

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
    Boolean(form.formState.errors.token) ||
    (isApiError(complete.error, 400) && !complete.error.fields.password);
  return (
    <Form
      form={form}
      onSubmit={(input) =>
        complete.mutate(input, { onError: (error) => applyServerErrors(form, error) })
      }
      className="space-y-5"
    >
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
      <FormTextField
        name="password"
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 8 characters. A short sentence is easy to remember."
        required
      />
      <FormTextField
        name="confirm"
        label="New password again"
        type="password"
        autoComplete="new-password"
        required
      />
      <Button type="submit" size="lg" className="w-full" busy={complete.isPending}>
        Save new password
      </Button>
    </Form>
  );
}
