// "Remove" beside a person the viewer may manage: asks first, says what happens to their sites.
import type { NetworkMember } from '../../../../shared/schemas/people';
import { Button } from '../../../components/ui/button';
import { errorSummary } from '../../../lib/form-errors';
import { plural } from '../../../lib/format';
import { useRemoveMember } from '../api/remove-member';

export function RemoveMemberButton({
  networkId,
  member,
}: {
  networkId: string;
  member: NetworkMember;
}) {
  const remove = useRemoveMember(networkId);
  function confirmRemove() {
    const sites =
      member.siteCount > 0
        ? ` Their ${plural(member.siteCount, 'site')} will have no grower until you hand ${member.siteCount === 1 ? 'it' : 'them'} on.`
        : '';
    if (window.confirm(`Remove ${member.name} from the network? They lose access at once.${sites}`))
      remove.mutate(member.userId);
  }
  return (
    <span className="inline-flex flex-col items-end">
      <Button variant="quiet" busy={remove.isPending} onClick={confirmRemove}>
        Remove
      </Button>
      {remove.error ? (
        <span className="text-caption text-danger">{errorSummary(remove.error)}</span>
      ) : null}
    </span>
  );
}
