import { makeStyles, tokens } from '@fluentui/react-components';

import type { PhotoResponse } from '../api/get-job-photos';
import { usePhotoActions } from '../hooks/photo-actions';

import { PhotoThumb } from './photo-thumb';

const useStyles = makeStyles({
  grid: {
    listStyle: 'none',
    margin: 0,
    padding: 0,
    display: 'grid',
    gridTemplateColumns: 'repeat(auto-fill, minmax(96px, 1fr))',
    gap: tokens.spacingHorizontalS,
    '@media (min-width: 640px)': { gridTemplateColumns: 'repeat(auto-fill, minmax(128px, 1fr))' },
  },
});

/** Thumbnails of `photos`; each opens the viewer, which then browses these photos. */
export function PhotoGrid({ photos, label }: { photos: readonly PhotoResponse[]; label: string }) {
  const styles = useStyles();
  const { view } = usePhotoActions();
  return (
    <ul className={styles.grid} aria-label={label}>
      {photos.map((photo) => (
        <li key={photo.id}>
          <PhotoThumb photo={photo} onOpen={() => view(photos, photo.id)} />
        </li>
      ))}
    </ul>
  );
}
