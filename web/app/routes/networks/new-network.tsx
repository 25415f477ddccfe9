// /networks/new: a signed-in person starts another network and becomes its admin.
import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { CreateNetworkInputSchema } from '../../../../shared/schemas/network';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { PageHeader } from '../../../components/ui/page-header';
import { TextField } from '../../../components/ui/text-field';
import { useCreateNetwork } from '../../../features/networks/api/networks';
import { apiFieldErrors, errorSummary, zodFieldErrors } from '../../../lib/form-errors';

export default function NewNetworkPage() {
  const create = useCreateNetwork();
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [error, setError] = useState<string | undefined>();

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = CreateNetworkInputSchema.safeParse({ name });
    if (!parsed.success) return setError(zodFieldErrors(parsed.error).name);
    setError(undefined);
    create.mutate(parsed.data, {
      onSuccess: () => navigate('/'),
      onError: (e) => setError(apiFieldErrors(e).name),
    });
  }

  return (
    <>
      <PageHeader
        title="Start another network"
        description="A separate group with its own people, trials and reports. You become its admin; switch between your networks from the menu at the top."
      />
      <Card className="max-w-lg p-5">
        <form onSubmit={submit} noValidate className="space-y-5">
          {create.error && !error ? (
            <Alert tone="danger">{errorSummary(create.error)}</Alert>
          ) : null}
          <TextField
            label="Name of the network"
            required
            value={name}
            onChange={(e) => setName(e.target.value)}
            error={error}
          />
          <Button type="submit" busy={create.isPending}>
            Start the network
          </Button>
        </form>
      </Card>
    </>
  );
}
