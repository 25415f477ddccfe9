// /network: the current network's settings; an admin can delete it after typing its name.
import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { TextField } from '../../../components/ui/text-field';
import { useMe } from '../../../features/auth/api/get-me';
import { useDeleteNetwork } from '../../../features/networks/api/networks';
import { useCurrentNetworkId } from '../../../features/networks/lib/current-network';
import { apiFieldErrors, errorSummary } from '../../../lib/form-errors';

function DeleteNetwork({ networkId, name }: { networkId: string; name: string }) {
  const remove = useDeleteNetwork(networkId);
  const navigate = useNavigate();
  const [typed, setTyped] = useState('');
  const matches = typed.trim() === name.trim();
  function submit(event: FormEvent) {
    event.preventDefault();
    if (matches) remove.mutate(typed, { onSuccess: () => navigate('/', { replace: true }) });
  }
  return (
    <Card className="max-w-xl space-y-4 border-danger-300 p-5">
      <h2 className="text-heading text-ink">Delete this network</h2>
      <p className="text-label text-ink-muted">
        Deletes every trial, site, strip, count, yield, photo, report and invitation of “{name}”,
        and its history. People keep their accounts if they belong to another network. This cannot
        be undone: download each trial’s archive first.
      </p>
      <form onSubmit={submit} noValidate className="space-y-4">
        {remove.error ? <Alert tone="danger">{errorSummary(remove.error)}</Alert> : null}
        <TextField
          label={`Type “${name}” to confirm`}
          value={typed}
          onChange={(e) => setTyped(e.target.value)}
          error={remove.error ? apiFieldErrors(remove.error).confirmName : undefined}
          autoComplete="off"
        />
        <Button type="submit" variant="danger" disabled={!matches} busy={remove.isPending}>
          Delete the network and everything in it
        </Button>
      </form>
    </Card>
  );
}

export default function NetworkSettingsPage() {
  const { data: user } = useMe();
  const networkId = useCurrentNetworkId(user);
  if (!user) return <LoadingBlock />;
  const membership = user.memberships.find((m) => m.networkId === networkId);
  if (!membership) return <Alert tone="info">You do not belong to a network yet.</Alert>;
  return (
    <>
      <PageHeader
        eyebrow="Network"
        title={membership.networkName}
        description={`You are ${membership.role === 'admin' ? 'an admin' : `a ${membership.role}`} of this network.`}
        actions={
          <ButtonLink to="/series" variant="secondary">
            Series across seasons
          </ButtonLink>
        }
      />
      {membership.role === 'admin' ? (
        <DeleteNetwork networkId={membership.networkId} name={membership.networkName} />
      ) : (
        <Alert tone="info">Only an admin of the network can delete it.</Alert>
      )}
    </>
  );
}
