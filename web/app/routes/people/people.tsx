// `/people`: a coordinator's or admin's view of a network's members and invitations.
import type { QueryClient } from '@tanstack/react-query';
import { redirect, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { Membership, SessionUser } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/form-fields';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { networkPeopleQueryOptions, useNetworkPeople } from '../../../features/people/api/people';
import { InvitationList } from '../../../features/people/components/invitation-list';
import { InviteForm } from '../../../features/people/components/invite-form';
import { MemberTable } from '../../../features/people/components/member-table';
import { errorSummary } from '../../../lib/form-errors';
import { plural } from '../../../lib/format';
import { isCoordinator } from '../../../lib/session';

/** The networks the user coordinates, and the one the `network` search parameter picks (or the first). */
function coordinatedNetworks(
  user: SessionUser,
  wanted: string | null,
): { networks: Membership[]; current: Membership | undefined } {
  const networks = user.memberships.filter((m) => m.role === 'admin' || m.role === 'coordinator');
  return { networks, current: networks.find((m) => m.networkId === wanted) ?? networks[0] };
}

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) return null;
    if (!isCoordinator(user)) throw redirect('/');
    const { current } = coordinatedNetworks(user, new URL(request.url).searchParams.get('network'));
    if (current) await queryClient.ensureQueryData(networkPeopleQueryOptions(current.networkId));
    return null;
  };

export default function PeoplePage() {
  const me = useMe();
  const [params, setParams] = useSearchParams();
  if (!me.data) return <LoadingBlock label="Loading…" />;
  const { networks, current } = coordinatedNetworks(me.data, params.get('network'));
  if (!current)
    return <Alert tone="caution">Only coordinators and administrators can manage people.</Alert>;
  return (
    <>
      <PageHeader
        eyebrow={current.networkName}
        title="People"
        description="Who is in the network and what they may do. Growers enter data for their own sites; members read published reports."
      />
      {networks.length > 1 ? (
        <SelectField
          label="Network"
          containerClassName="mb-6 max-w-sm"
          value={current.networkId}
          onChange={(e) => setParams({ network: e.target.value })}
        >
          {networks.map((n) => (
            <option key={n.networkId} value={n.networkId}>
              {n.networkName}
            </option>
          ))}
        </SelectField>
      ) : null}
      <NetworkPeople key={current.networkId} membership={current} />
    </>
  );
}

function NetworkPeople({ membership }: { membership: Membership }) {
  const { networkId, role } = membership;
  const people = useNetworkPeople(networkId);
  if (people.isError && !people.data) {
    return (
      <Alert
        tone="danger"
        title="Could not load the people of this network"
        action={
          <Button variant="secondary" onClick={() => void people.refetch()}>
            Try again
          </Button>
        }
      >
        {errorSummary(people.error)}
      </Alert>
    );
  }
  if (!people.data) return <LoadingBlock label="Loading people…" />;
  return (
    <div className="space-y-8">
      <section aria-labelledby="members-heading" className="space-y-3">
        <h2 id="members-heading" className="text-heading text-ink">
          Members{' '}
          <span className="text-label font-normal text-ink-muted">
            ({plural(people.data.members.length, 'person', 'people')})
          </span>
        </h2>
        {role === 'coordinator' ? (
          <p className="text-label text-ink-muted">
            You can switch people between grower and member; ask an administrator to change
            coordinators and administrators.
          </p>
        ) : null}
        <MemberTable networkId={networkId} members={people.data.members} viewerRole={role} />
      </section>
      <section aria-labelledby="invitations-heading" className="space-y-3">
        <h2 id="invitations-heading" className="text-heading text-ink">
          Pending invitations
        </h2>
        <InvitationList networkId={networkId} invitations={people.data.invitations} />
      </section>
      <section aria-labelledby="invite-heading">
        <Card className="space-y-3">
          <h2 id="invite-heading" className="text-heading text-ink">
            Invite someone
          </h2>
          <p className="text-label text-ink-muted">
            They get an e-mail with a link to set their name and password; it works for 14 days.
          </p>
          <InviteForm networkId={networkId} viewerRole={role} />
        </Card>
      </section>
    </div>
  );
}
