// /trials/:trialId/meeting: the pooled report as full-screen slides for the winter meeting.
import type { QueryClient } from '@tanstack/react-query';
import { redirect, useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions } from '../../../features/auth/api/get-me';
import {
  pooledReportQueryOptions,
  usePooledReport,
} from '../../../features/reports/api/get-pooled-report';
import { MeetingSlides } from '../../../features/reports/components/meeting-slides';
import { isApiError } from '../../../lib/api-client';
import { signInPath } from '../../../lib/redirects';
import { isNotFound, NotFoundPanel } from '../../route-errors';
import { NotPublishedPanel } from './not-published';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params, request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) throw redirect(signInPath(new URL(request.url)));
    await queryClient.ensureQueryData(pooledReportQueryOptions(String(params.trialId)));
    return null;
  };

export default function MeetingPage() {
  const trialId = String(useParams().trialId);
  const { data } = usePooledReport(trialId);
  if (!data) return <LoadingBlock label="Preparing the slides…" />;
  return <MeetingSlides report={data} backTo={`/trials/${trialId}/report`} />;
}

export function ErrorBoundary() {
  const error = useRouteError();
  const body = isNotFound(error) ? (
    <NotFoundPanel title="No such trial" />
  ) : isApiError(error, 403) ? (
    <NotPublishedPanel what="network report" />
  ) : null;
  if (!body) throw error;
  return <div className="mx-auto max-w-page p-6">{body}</div>;
}
