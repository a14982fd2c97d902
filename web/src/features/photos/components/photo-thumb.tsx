import { makeStyles, Spinner, tokens } from '@fluentui/react-components';
import { ImageOff24Regular } from '@fluentui/react-icons';

import type { PhotoResponse } from '../api/get-job-photos';
import { usePhotoUrl } from '../api/get-photo-file';

const useStyles = makeStyles({
  button: {
    position: 'relative',
    display: 'block',
    width: '100%',
    aspectRatio: '1',
    padding: 0,
    border: 'none',
    borderRadius: tokens.borderRadiusMedium,
    overflow: 'hidden',
    cursor: 'pointer',
    backgroundColor: tokens.colorNeutralBackground4,
    ':focus-visible': { outline: `${tokens.strokeWidthThick} solid ${tokens.colorStrokeFocus2}`, outlineOffset: tokens.strokeWidthThin },
  },
  image: { width: '100%', height: '100%', objectFit: 'cover', display: 'block' },
  placeholder: { position: 'absolute', inset: 0, display: 'flex', alignItems: 'center', justifyContent: 'center', color: tokens.colorNeutralForeground3 },
  caption: {
    position: 'absolute',
    insetInline: 0,
    bottom: 0,
    padding: `${tokens.spacingVerticalXXS} ${tokens.spacingHorizontalXS}`,
    color: tokens.colorNeutralForegroundStaticInverted,
    backgroundColor: tokens.colorBackgroundOverlay,
    fontSize: tokens.fontSizeBase200,
    textAlign: 'start',
    whiteSpace: 'nowrap',
    overflow: 'hidden',
    textOverflow: 'ellipsis',
  },
});

/** A square thumbnail that opens the viewer; the caption sits on it. */
export function PhotoThumb({ photo, onOpen }: { photo: PhotoResponse; onOpen: () => void }) {
  const styles = useStyles();
  const { url, isError } = usePhotoUrl(photo.id, 'thumb');
  const name = photo.caption ?? photo.original.name ?? 'photo';
  return (
    <button type="button" className={styles.button} onClick={onOpen} aria-label={`Open photo: ${name}`}>
      {url ? (
        // The button's label names the photo and its caption is printed on it: the picture adds no words.
        <img src={url} alt="" className={styles.image} />
      ) : (
        <span className={styles.placeholder}>{isError ? <ImageOff24Regular aria-hidden /> : <Spinner size="tiny" />}</span>
      )}
      {photo.caption && <span className={styles.caption}>{photo.caption}</span>}
    </button>
  );
}
