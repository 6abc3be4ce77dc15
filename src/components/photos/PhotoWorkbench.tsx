import { useState } from 'react';
import type { PhotoLayer, PhotoView } from '~/lib/photos';
import PhotoCard from './PhotoCard';
import PhotoUploader from './PhotoUploader';

interface Props {
  couponId: number;
  layers: PhotoLayer[];
  photos: PhotoView[];
  /** The coupon's owner (or an admin): may upload, mark regions and delete. Rendered without JavaScript otherwise. */
  canEdit: boolean;
}

/** A coupon's photos with their regions and swatches, and for its owner the uploader. */
export default function PhotoWorkbench({ couponId, layers, photos: initial, canEdit }: Props) {
  const [photos, setPhotos] = useState(initial);
  const replace = (photo: PhotoView) => setPhotos((current) => current.map((entry) => (entry.id === photo.id ? photo : entry)));

  return (
    <div className="@container space-y-4">
      {canEdit && <PhotoUploader couponId={couponId} onAdded={(photo) => setPhotos((current) => [...current, photo])} />}
      {photos.length === 0 ? (
        <p className="text-ash-700">{canEdit ? 'No photos yet. Add one above, then mark a region on each layer.' : 'No photos yet.'}</p>
      ) : (
        <div className="space-y-4" aria-label="Photos">
          {photos.map((photo) => (
            <PhotoCard
              key={photo.id}
              photo={photo}
              layers={layers}
              editable={canEdit}
              onChanged={replace}
              onDeleted={(id) => setPhotos((current) => current.filter((entry) => entry.id !== id))}
            />
          ))}
        </div>
      )}
    </div>
  );
}
