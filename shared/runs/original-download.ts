/**
 * The Content-Type of a run's original file on download (issue 13 #14): taken from the stored bytes and the format
 * the importer detected from them, never from the uploaded file's name (a file named `.html` is still served as a
 * download, not as a page). gzip's magic number 1f 8b (RFC 1952) → application/gzip; GPX → application/gpx+xml (the
 * type the GPX 1.1 schema documentation registers); TCX and anything else → application/octet-stream (TCX has no
 * registered type of its own).
 */
export function originalContentType(format: string, firstBytes: Uint8Array): string {
  if (firstBytes.length >= 2 && firstBytes[0] === 0x1f && firstBytes[1] === 0x8b) return 'application/gzip';
  if (format === 'gpx') return 'application/gpx+xml';
  return 'application/octet-stream';
}

/** Every type `originalContentType` can answer: the original-file route declares these in /api/openapi.json. */
export const ORIGINAL_CONTENT_TYPES = ['application/gpx+xml', 'application/gzip', 'application/octet-stream'] as const;
