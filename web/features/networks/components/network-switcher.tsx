// The header's network menu: which network the pages show, and a way to start another.
import { useNavigate } from 'react-router-dom';
import type { SessionUser } from '../../../../shared/schemas/auth';
import { setCurrentNetwork, useCurrentNetworkId } from '../lib/current-network';

const START = '__start__';

export function NetworkSwitcher({ user, className }: { user: SessionUser; className?: string }) {
  const current = useCurrentNetworkId(user);
  const navigate = useNavigate();
  if (user.memberships.length === 0) return null;
  return (
    <label className={className}>
      <span className="sr-only">Network</span>
      <select
        data-testid="network-switcher"
        className="min-h-11 max-w-[14rem] truncate rounded-field border border-field-600 bg-field-900 px-2 text-label font-medium text-field-50"
        value={current ?? ''}
        onChange={(e) => {
          if (e.target.value === START) {
            navigate('/networks/new');
            return;
          }
          setCurrentNetwork(e.target.value);
          navigate('/');
        }}
      >
        {user.memberships.map((m) => (
          <option key={m.networkId} value={m.networkId}>
            {m.networkName}
          </option>
        ))}
        <option value={START}>Start another network…</option>
      </select>
    </label>
  );
}
