// The photo pipeline's server-side entry points. Client code imports `./loader` and `./renditions` directly.
export { deletePhoto, findPhotoTarget, processUpload, removePhotoFiles, savePhoto, type StoredPhoto, type UploadToProcess } from './pipeline';
export { PhotoRefusedError, processPhoto, type ProcessedPhoto } from './process';
export { photoConfig, assertUploadsConfigured } from './config';
