/** Messages of the upload form that tests read too (kept free of React Native imports). */

/** Said under the file picker when Upload is pressed with no file chosen. */
export const noFileMessage = 'No file chosen yet: press "Choose a GeoTIFF…" and pick the elevation grid (.tif or .tiff), then press Upload again.';
