// Shared pieces for route ErrorBoundaries: recognise "not found" and show friendly panels.
import { isRouteErrorResponse } from 'react-router-dom';
import { ButtonLink } from '../components/ui/button';
import { EmptyState } from '../components/ui/empty-state';
import { isApiError } from '../lib/api-client';

/** True for a 404 from the API or a thrown 404 Response (an unknown path or id). */
export function isNotFound(error: unknown): boolean {
  return isApiError(error, 404) || (isRouteErrorResponse(error) && error.status === 404);
}

export function NotFoundPanel({
  title = 'Nothing here',
  children = 'The page or record you asked for does not exist, or it was removed. Check the link, or start again from your home page.',
}: {
  title?: string;
  children?: React.ReactNode;
}) {
  return (
    <EmptyState
      titleAs="h1"
      title={title}
      action={
        <ButtonLink to="/" variant="secondary">
          Back to home
        </ButtonLink>
      }
    >
      {children}
    </EmptyState>
  );
}
