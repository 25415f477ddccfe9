// `/sites/:siteId/photos`: the site's photos, per strip or whole site, and the upload form.
import { Card } from '../../../components/ui/card';
import { LoadingBlock } from '../../../components/ui/spinner';
import { useSitePhotos } from '../../../features/collect/api/photos';
import { PhotoGrid, PhotoUploader } from '../../../features/collect/components/photo-panel';
import { SiteHeading } from '../../../features/collect/components/site-heading';
import { CollectErrorBoundary, siteStripsLoader, WithSiteStrips } from './collect-route';

export const clientLoader = siteStripsLoader;
export const ErrorBoundary = CollectErrorBoundary;

export default function PhotosPage() {
  return (
    <WithSiteStrips>
      {(data) => (
        <>
          <SiteHeading site={data.site} title={`${data.site.fieldName}: photos`} />
          <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
            <SitePhotoList siteId={data.site.siteId} strips={data.strips} />
            {data.site.canEdit ? (
              <Card>
                <h2 className="mb-3 text-heading text-ink">Add a photo</h2>
                <PhotoUploader siteId={data.site.siteId} strips={data.strips} />
              </Card>
            ) : null}
          </div>
        </>
      )}
    </WithSiteStrips>
  );
}

function SitePhotoList({
  siteId,
  strips,
}: {
  siteId: string;
  strips: Parameters<typeof PhotoGrid>[0]['strips'];
}) {
  const photos = useSitePhotos(siteId);
  if (!photos.data) return <LoadingBlock label="Loading photos…" />;
  return <PhotoGrid photos={photos.data} strips={strips} />;
}
