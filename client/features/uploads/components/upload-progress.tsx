import type { ImportProgress } from '@shared/contract/uploads.ts';

const NUMBER = new Intl.NumberFormat();

/** A byte count in binary units as file managers show it: "512 B", "3.4 MB", "1.9 GB". */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const units = ['KB', 'MB', 'GB', 'TB'];
  let value = bytes / 1024;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return `${value.toFixed(value < 10 ? 1 : 0)} ${units[unit]}`;
}

/**
 * Two indicators for a running upload: a progress bar of the bytes sent, and the import's own
 * count of readings stored so far (it stores while the file is still arriving).
 */
export function UploadProgress({ sent, total, progress, onCancel }: { sent: number; total: number; progress: ImportProgress | null; onCancel: () => void }) {
  const percent = total > 0 ? Math.min(100, Math.round((sent / total) * 100)) : 0;
  return (
    <section aria-label="Upload progress" className="grid gap-4 rounded-xl border border-rule bg-card p-5">
      <div className="grid gap-1">
        <label htmlFor="upload-bytes" className="text-sm font-medium">
          Sending the file: {formatBytes(sent)} of {formatBytes(total)} ({percent}%)
        </label>
        <progress id="upload-bytes" max={total || 1} value={sent} className="h-3 w-full accent-lichen" />
      </div>
      <p role="status" aria-live="polite" className="text-sm">
        {progress
          ? `Importing: ${NUMBER.format(progress.accepted)} readings stored so far from ${NUMBER.format(progress.lines)} lines (${NUMBER.format(progress.duplicates)} already there, ${NUMBER.format(progress.quarantined)} quarantined).`
          : 'Importing: waiting for the first batch to be stored…'}
      </p>
      <div>
        <button type="button" onClick={onCancel} className="text-sm text-alert underline-offset-2 hover:underline">
          Cancel the upload
        </button>
      </div>
    </section>
  );
}
