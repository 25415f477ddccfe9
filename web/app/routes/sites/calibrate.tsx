// `/calibrate`: the public seeder calibration helper; signed-in growers can save to a site.
import { useSearchParams } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/page-header';
import { useMe } from '../../../features/auth/api/get-me';
import { CalibrationHelper } from '../../../features/calculator/components/calibration-helper';

export default function CalibratePage() {
  const { data: user } = useMe();
  const [search] = useSearchParams();
  return (
    <>
      <PageHeader
        eyebrow="Seeder check"
        title="Calibrate a walk-behind seeder"
        description="Turn the drive wheel over a bowl, count the seeds, and see how close the seeder is to the rate you want — and what to change."
      />
      <CalibrationHelper user={user ?? null} initialSiteId={search.get('site')} />
    </>
  );
}
