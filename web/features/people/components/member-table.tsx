// The network's members: name, e-mail, role (a select where the viewer may change it) and
// site count. A table on wide screens; each row stacks into a card on a phone.
import type { Role } from '../../../../shared/schemas/common';
import { grantableRoles, type NetworkMember } from '../../../../shared/schemas/people';
import { Alert } from '../../../components/ui/alert';
import { SelectField } from '../../../components/ui/form-fields';
import { errorSummary } from '../../../lib/form-errors';
import { plural, roleName } from '../../../lib/format';
import { useChangeRole } from '../api/people';
import { RemoveMemberButton } from './remove-member-button';

export function MemberTable({
  networkId,
  members,
  viewerRole,
}: {
  networkId: string;
  members: NetworkMember[];
  viewerRole: Role;
}) {
  const change = useChangeRole(networkId);
  const allowed = grantableRoles(viewerRole);
  const cell =
    'flex items-center justify-between gap-3 px-4 py-1 md:table-cell md:px-3 md:py-2 md:align-middle';
  const cellLabel = 'text-caption text-ink-muted md:hidden';
  return (
    <div className="space-y-3">
      {change.isError ? (
        <Alert tone="danger" title="The role was not changed">
          {errorSummary(change.error)}
        </Alert>
      ) : null}
      <table className="block w-full text-left text-label md:table md:rounded-card md:border md:border-line md:bg-surface md:shadow-card">
        <thead className="sr-only md:not-sr-only md:table-header-group md:bg-sunken md:text-caption md:text-ink-muted">
          <tr>
            <th scope="col" className="px-3 py-2">
              Name
            </th>
            <th scope="col" className="px-3 py-2">
              E-mail
            </th>
            <th scope="col" className="px-3 py-2">
              Role
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Sites
            </th>
          </tr>
        </thead>
        <tbody className="block space-y-3 md:table-row-group md:space-y-0">
          {members.map((m) => {
            const editable = allowed.includes(m.role);
            const pending = change.isPending && change.variables?.userId === m.userId;
            return (
              <tr
                key={m.userId}
                className="block rounded-card border border-line bg-surface py-2 shadow-card md:table-row md:rounded-none md:border-x-0 md:border-b-0 md:py-0 md:shadow-none"
              >
                <th
                  scope="row"
                  className="block px-4 pb-1 pt-2 font-semibold text-ink md:table-cell md:px-3 md:py-2 md:align-middle"
                >
                  {m.name}
                </th>
                <td className={cell}>
                  <span className={cellLabel}>E-mail</span>
                  <span className="min-w-0 break-all text-right md:text-left">{m.email}</span>
                </td>
                <td className={cell}>
                  <span className={cellLabel}>Role</span>
                  {editable ? (
                    <SelectField
                      label={<span className="sr-only">Role of {m.name}</span>}
                      containerClassName="min-w-40 gap-0"
                      value={m.role}
                      disabled={pending}
                      onChange={(e) =>
                        change.mutate({ userId: m.userId, role: e.target.value as Role })
                      }
                    >
                      {allowed.map((role) => (
                        <option key={role} value={role}>
                          {roleName(role)}
                        </option>
                      ))}
                    </SelectField>
                  ) : (
                    <span>{roleName(m.role)}</span>
                  )}
                </td>
                <td className={`${cell} md:text-right`}>
                  <span className={cellLabel}>Sites</span>
                  <span className="figures">
                    <span className="md:hidden">{plural(m.siteCount, 'site')}</span>
                    <span className="hidden md:inline">{m.siteCount}</span>
                  </span>
                  {editable ? <RemoveMemberButton networkId={networkId} member={m} /> : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
