/** Media types of the API's file answers, as routes declare them and /api/openapi.json documents them. */
export const CSV = 'text/csv';
export const ZIP = 'application/zip';
/** RFC 5545. */
export const ICALENDAR = 'text/calendar';
