// Public surface of the photos feature: other features import only from here (eslint.config.js checks it).
// Job photos: the strip, the section, the provider and its actions.
export { useJobPhotos } from './api/get-job-photos';
export { PhotoStrip } from './components/photo-strip';
export { PhotosProvider } from './components/photos-provider';
export { PhotosSection } from './components/photos-section';
export { usePhotoActions } from './hooks/photo-actions';
