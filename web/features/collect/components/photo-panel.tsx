// Photo upload (JPEG, PNG or WebP; checked again on the server) and scaled photo lists.
import { useRef, useState, type FormEvent } from 'react';
import type { PhotoDto } from '../../../../shared/schemas/photo';
import type { StripDto } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { TextField } from '../../../components/ui/text-field';
import { errorSummary } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { useSitePhotos, useUploadPhoto } from '../api/photos';

export function PhotoUploader({
  siteId,
  strips,
  stripId,
}: {
  siteId: string;
  strips?: StripDto[];
  stripId?: string;
}) {
  const upload = useUploadPhoto(siteId);
  const fileRef = useRef<HTMLInputElement>(null);
  const [caption, setCaption] = useState('');
  const [chosenStrip, setChosenStrip] = useState(stripId ?? '');
  const submit = (event: FormEvent) => {
    event.preventDefault();
    const file = fileRef.current?.files?.[0];
    if (!file) return;
    upload.mutate(
      { file, stripId: chosenStrip || undefined, caption },
      {
        onSuccess: () => {
          setCaption('');
          if (fileRef.current) fileRef.current.value = '';
        },
      },
    );
  };
  return (
    <form onSubmit={submit} className="space-y-3">
      <div className="flex flex-col gap-1.5">
        <label htmlFor={`photo-file-${stripId ?? 'site'}`} className="text-label text-ink">
          Photo (JPEG, PNG or WebP, up to 8 MB)
        </label>
        <input
          ref={fileRef}
          id={`photo-file-${stripId ?? 'site'}`}
          type="file"
          accept="image/jpeg,image/png,image/webp"
          className="block w-full text-label file:mr-3 file:min-h-11 file:rounded-field file:border file:border-line-strong file:bg-surface file:px-4 file:font-semibold"
        />
      </div>
      {strips && !stripId ? (
        <div className="flex flex-col gap-1.5">
          <label htmlFor="photo-strip" className="text-label text-ink">
            Strip
          </label>
          <select
            id="photo-strip"
            value={chosenStrip}
            onChange={(event) => setChosenStrip(event.target.value)}
            className="min-h-11 rounded-field border border-line-strong bg-surface px-3"
          >
            <option value="">The whole site</option>
            {strips.map((s) => (
              <option key={s.stripId} value={s.stripId}>
                Plot {s.plotNumber} (block {s.block}) · {s.label}
              </option>
            ))}
          </select>
        </div>
      ) : null}
      <TextField
        label="Caption"
        value={caption}
        maxLength={300}
        onChange={(event) => setCaption(event.target.value)}
      />
      {upload.isError ? <Alert tone="danger">{errorSummary(upload.error)}</Alert> : null}
      <Button type="submit" variant="secondary" busy={upload.isPending}>
        Upload photo
      </Button>
    </form>
  );
}

export function PhotoGrid({ photos, strips }: { photos: PhotoDto[]; strips?: StripDto[] }) {
  if (photos.length === 0) {
    return (
      <EmptyState title="No photos yet">
        A photo of each block at heading, or of an odd strip, helps the coordinator read the
        numbers.
      </EmptyState>
    );
  }
  return (
    <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
      {photos.map((photo) => {
        const strip = strips?.find((s) => s.stripId === photo.stripId);
        return (
          <li
            key={photo.id}
            className="overflow-hidden rounded-field border border-line bg-surface"
          >
            <a href={photo.url} target="_blank" rel="noreferrer">
              <img
                src={photo.url}
                alt={photo.caption || 'Field photo'}
                loading="lazy"
                className="aspect-[4/3] w-full object-cover"
              />
            </a>
            <div className="space-y-0.5 p-2 text-caption">
              {photo.caption ? <p className="text-ink">{photo.caption}</p> : null}
              <p className="text-ink-muted">
                {strip ? `Plot ${strip.plotNumber} · ` : photo.stripId ? '' : 'Whole site · '}
                {formatDateTime(photo.createdAt)}
              </p>
            </div>
          </li>
        );
      })}
    </ul>
  );
}

export function StripPhotos({
  siteId,
  stripId,
  canUpload,
}: {
  siteId: string;
  stripId: string;
  canUpload: boolean;
}) {
  const photos = useSitePhotos(siteId);
  const mine = (photos.data ?? []).filter((p) => p.stripId === stripId);
  return (
    <Card className="space-y-4 p-4 sm:p-5">
      <h2 className="text-heading text-ink">Photos of this strip</h2>
      {mine.length > 0 ? (
        <PhotoGrid photos={mine} />
      ) : (
        <p className="text-label text-ink-muted">No photos of this strip yet.</p>
      )}
      {canUpload ? <PhotoUploader siteId={siteId} stripId={stripId} /> : null}
    </Card>
  );
}
