// The grower decides whether network reports show their field's name or a neutral label.
import { Card } from '../../../components/ui/card';
import { errorSummary } from '../../../lib/form-errors';
import { useSetNaming, useSiteDetail } from '../api/naming';

export function NamingChoice({ siteId }: { siteId: string }) {
  const site = useSiteDetail(siteId);
  const setNaming = useSetNaming(siteId);
  if (!site.data?.isGrower) return null;
  // Show the choice at once; the server's answer follows.
  const named = setNaming.isPending ? setNaming.variables : site.data.namedInReports;
  return (
    <Card data-testid="naming-choice">
      <h2 className="text-heading text-ink">How reports name your farm</h2>
      <p className="mt-1 text-label text-ink-muted">
        Other growers and members see your results in network reports. Your e-mail, fertility and
        notes are never shown to them.
      </p>
      <fieldset className="mt-3 space-y-2">
        <legend className="sr-only">Name in network reports</legend>
        <label className="flex min-h-11 items-center gap-3 text-label text-ink">
          <input
            type="radio"
            name="naming"
            className="size-5"
            checked={!named}
            onChange={() => setNaming.mutate(false)}
          />
          As “{site.data.reportLabel}” (nobody can tell it is yours)
        </label>
        <label className="flex min-h-11 items-center gap-3 text-label text-ink">
          <input
            type="radio"
            name="naming"
            className="size-5"
            checked={named}
            onChange={() => setNaming.mutate(true)}
          />
          By name: “{site.data.fieldName}”
        </label>
      </fieldset>
      {setNaming.error ? (
        <p className="mt-2 text-caption text-danger">{errorSummary(setNaming.error)}</p>
      ) : null}
    </Card>
  );
}
