// /sites/:siteId/report: one grower's site report (live for the coordinator and grower, the
// published snapshot for members).
import type { QueryClient } from '@tanstack/react-query';
import { useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { homeKind } from '../../../lib/session';
import {
  siteReportQueryOptions,
  useSiteReport,
} from '../../../features/reports/api/get-site-report';
import { SiteReportView } from '../../../features/reports/components/site-report-view';
import { isApiError } from '../../../lib/api-client';
import { AmendmentsNotice } from '../../../features/reports/components/amendments-notice';
import { reportDisplayUnits } from '../../../../shared/units/report-units';
import { isNotFound, NotFoundPanel } from '../../route-errors';
import { NotPublishedPanel } from './not-published';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) return null;
    await queryClient.ensureQueryData(siteReportQueryOptions(String(params.siteId)));
    return null;
  };

export default function SiteReportPage() {
  const siteId = String(useParams().siteId);
  const { data } = useSiteReport(siteId);
  const { data: user } = useMe();
  if (!data) return <LoadingBlock label="Loading the site report…" />;
  // Coordinators and growers read the trial page; members come from their list of reports.
  const back =
    data.canPublish || (user && homeKind(user) !== 'member')
      ? { to: `/trials/${data.site.trialId}`, label: data.site.trialName }
      : { to: '/', label: 'Reports' };
  return (
    <>
      <AmendmentsNotice
        trialId={data.site.trialId}
        system={reportDisplayUnits(data.site.units, data.site.crop).system}
      />
      <SiteReportView report={data} back={back} />
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (isNotFound(error)) return <NotFoundPanel title="No such site report" />;
  if (isApiError(error, 403)) return <NotPublishedPanel what="site report" />;
  throw error;
}
