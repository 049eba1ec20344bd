import { useId, useState, type ChangeEvent } from 'react';
import { MAX_UPLOAD_BYTES } from '@shared/contract/uploads.ts';
import { Button } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';
import { PREVIEW_BYTES, previewCsv, type CsvPreview } from '../hooks/csv-preview.ts';
import { guessUploadSetup, toUploadOptions, type UploadSetup } from '../hooks/upload-setup.ts';
import { useUpload } from '../hooks/use-upload.ts';
import { ColumnMapping, type MappingChannel } from './column-mapping.tsx';
import { CsvPreviewTable } from './csv-preview-table.tsx';
import { TimePreviewTable } from './time-preview-table.tsx';
import { useUploadTimesPreview } from '../api/preview-upload-times.ts';
import { TIME_LAYOUT_LABELS, type TimePreviewInput } from '@shared/contract/uploads.ts';
import { formatBytes, UploadProgress } from './upload-progress.tsx';
import { UploadSummary } from './upload-summary.tsx';
import { UPLOAD_MESSAGES } from '../messages.ts';

interface Chosen {
  file: File;
  /** The first {@link PREVIEW_BYTES} of the file as text. */
  head: string;
  preview: CsvPreview;
}

/**
 * Historical upload for one logger: choose a CSV file (up to 2 GB), see its first rows as the
 * import will read them, map its columns to the logger's channels, then send it with a bar for
 * the bytes sent and a count of readings stored, and finally the import's summary. Only the
 * first 64 KB are read in the browser; the file itself goes to the server as it is.
 */
export function UploadPanel({
  slug,
  loggerId,
  loggerTimeZone,
  channels,
  quarantineHref,
}: {
  slug: string;
  loggerId: number;
  loggerTimeZone: string;
  channels: MappingChannel[];
  quarantineHref: string;
}) {
  const fileInputId = useId();
  const [chosen, setChosen] = useState<Chosen | null>(null);
  const [setup, setSetup] = useState<UploadSetup | null>(null);
  const [problems, setProblems] = useState<string[]>([]);
  const [fileError, setFileError] = useState<string | null>(null);
  // A new key empties the file box, so the same file can be chosen again after an upload.
  const [inputKey, setInputKey] = useState(0);
  const upload = useUpload(slug, loggerId);
  const timesPreview = useUploadTimesPreview(slug, loggerId, chosen && setup ? timePreviewInput(chosen.preview, setup) : null);

  async function choose(e: ChangeEvent<HTMLInputElement>) {
    const file = e.target.files?.[0];
    setChosen(null);
    setSetup(null);
    setProblems([]);
    setFileError(null);
    upload.reset();
    if (!file) return;
    if (file.size > MAX_UPLOAD_BYTES)
      return setFileError(`${file.name} is ${formatBytes(file.size)}; files up to 2 GB are accepted. Split it and upload the parts.`);
    if (file.size === 0) return setFileError(`${file.name} is empty.`);
    const head = await file.slice(0, PREVIEW_BYTES).text();
    const preview = previewCsv(head, file.size > PREVIEW_BYTES);
    if (preview.header.length < 2) return setFileError(UPLOAD_MESSAGES.notACsv);
    setChosen({ file, head, preview });
    setSetup(
      guessUploadSetup(
        preview.header,
        preview.delimiter,
        channels.map((c) => c.key),
        loggerTimeZone,
      ),
    );
  }

  function changeSetup(next: UploadSetup) {
    setProblems([]);
    if (chosen && next.delimiter !== setup?.delimiter) {
      // Another delimiter means other columns: read the preview again and guess afresh.
      const preview = previewCsv(chosen.head, chosen.file.size > PREVIEW_BYTES, next.delimiter);
      setChosen({ ...chosen, preview });
      setSetup({
        ...guessUploadSetup(
          preview.header,
          next.delimiter,
          channels.map((c) => c.key),
          next.timeZone,
        ),
        timeFormat: next.timeFormat,
      });
      return;
    }
    setSetup(next);
  }

  function start() {
    if (!chosen || !setup) return;
    const result = toUploadOptions(setup, chosen.preview.header);
    if (!result.ok) return setProblems(result.problems);
    // An upload whose first rows' times cannot be read is not started (they would all go to quarantine).
    const times = timesPreview.data;
    if (times && setup.timeFormat === 'auto' && times.layout !== 'auto') {
      return setProblems([
        times.layout
          ? `timeFormat: these times are not ISO 8601 or epoch milliseconds; choose “${TIME_LAYOUT_LABELS[times.layout as keyof typeof TIME_LAYOUT_LABELS]}” (the table shows how it reads them)`
          : `timeFormat: ${times.guess.reason ?? 'no layout reads these times'}; choose a layout or give a pattern`,
      ]);
    }
    if (times && !times.readable) return setProblems(['timeFormat: some of the first times cannot be read this way (see the table); choose another layout']);
    upload.start(chosen.file, result.options);
  }

  const state = upload.state;
  const locked = state.phase === 'running';
  return (
    <div className="grid gap-6">
      <div className="grid gap-1">
        <label htmlFor={fileInputId} className="text-sm font-medium">
          Export file (CSV, up to 2 GB)
        </label>
        <input
          key={inputKey}
          id={fileInputId}
          type="file"
          accept=".csv,.txt,.tsv,text/csv,text/plain"
          disabled={locked}
          onChange={(e) => void choose(e)}
          className="block text-sm file:mr-3 file:rounded-lg file:border file:border-rule file:bg-card file:px-3 file:py-1.5 file:font-medium"
        />
        {fileError && (
          <p role="alert" className="text-sm text-alert">
            {fileError}
          </p>
        )}
      </div>

      {chosen && setup && state.phase !== 'done' && (
        <>
          <p className="text-sm text-ink-soft">
            {chosen.file.name} · {formatBytes(chosen.file.size)}
          </p>
          <CsvPreviewTable preview={chosen.preview} fileName={chosen.file.name} />
          <fieldset disabled={locked} className="grid gap-5">
            <legend className="sr-only">How to read the file</legend>
            <ColumnMapping header={chosen.preview.header} channels={channels} setup={setup} onChange={changeSetup} />
          </fieldset>
          {timesPreview.data && (
            <TimePreviewTable answer={timesPreview.data} asked={setup.timeFormat} onUseLayout={(timeFormat) => changeSetup({ ...setup, timeFormat })} />
          )}
          {timesPreview.error && <p className="text-sm text-ink-soft">The preview of the times could not be made: {timesPreview.error.message}</p>}
          {problems.length > 0 && (
            <Notice tone="alert">
              <p className="font-medium">The file cannot be read this way yet:</p>
              <ul className="mt-1 list-disc pl-5">
                {problems.map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            </Notice>
          )}
          {state.phase !== 'running' && (
            <div>
              <Button tone="primary" onClick={start}>
                Start the upload
              </Button>
            </div>
          )}
        </>
      )}

      {state.phase === 'running' && <UploadProgress sent={state.sent} total={state.total} progress={state.progress} onCancel={upload.cancel} />}
      {state.phase === 'failed' && (
        <Notice tone="alert">
          {state.message}
          {state.progress && ` Stored before it stopped: ${state.progress.accepted} readings.`}
        </Notice>
      )}
      {state.phase === 'done' && (
        <UploadSummary
          summary={state.summary}
          quarantineHref={quarantineHref}
          onAgain={() => {
            upload.reset();
            setChosen(null);
            setSetup(null);
            setInputKey((k) => k + 1);
          }}
        />
      )}
    </div>
  );
}

/** The preview request for the chosen time column, or null while there is nothing to ask (no column, an empty pattern). */
function timePreviewInput(preview: CsvPreview, setup: UploadSetup): TimePreviewInput | null {
  const at = preview.header.indexOf(setup.timeColumn);
  if (at < 0 || preview.rows.length === 0) return null;
  if (setup.timeFormat === 'pattern' && !setup.timePattern?.trim()) return null;
  return {
    samples: preview.rows.map((row) => (row[at] ?? '').slice(0, 100)),
    timeFormat: setup.timeFormat,
    timePattern: setup.timeFormat === 'pattern' ? setup.timePattern : undefined,
    timeZone: setup.timeZone || 'UTC',
  };
}
