/**
 * `GET /api/v1/labs/:lab/export.zip` (admins): the full export, downloaded by the browser itself
 * (a plain link with the session cookie), so a large lab streams to disk, never into memory.
 */
export function labExportUrl(slug: string): string {
  return `/api/v1/labs/${encodeURIComponent(slug)}/export.zip`;
}
