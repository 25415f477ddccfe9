// Any unknown path inside the signed-in area.
import { NotFoundPanel } from '../../route-errors';

export default function NotFoundPage() {
  return <NotFoundPanel title="No such page" />;
}
