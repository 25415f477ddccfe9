// What a member sees when a report is not published yet.
import { ButtonLink } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';

export function NotPublishedPanel({ what }: { what: string }) {
  return (
    <EmptyState
      titleAs="h1"
      title={`This ${what} is not published yet`}
      action={
        <ButtonLink to="/" variant="secondary">
          Back to home
        </ButtonLink>
      }
    >
      The coordinator publishes reports once the data are checked, usually before the winter
      meeting. You will find it on your home page then.
    </EmptyState>
  );
}
