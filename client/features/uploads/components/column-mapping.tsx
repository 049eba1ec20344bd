import { TIME_LAYOUT_LABELS } from '@shared/contract/uploads.ts';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { TimeZoneSelect } from '../../../components/time-zone-select.tsx';
import type { Delimiter } from '../hooks/csv-preview.ts';
import type { TimeFormat, UploadFormat, UploadSetup } from '../hooks/upload-setup.ts';

export interface MappingChannel {
  key: string;
  label: string;
}

const DELIMITER_LABELS: Record<Delimiter, string> = { ',': 'Comma (,)', ';': 'Semicolon (;)', '\t': 'Tab' };
/** The layouts the server reads (from the uploads contract), in the order the form lists them. */
const TIME_FORMAT_LABELS: Record<TimeFormat, string> = {
  auto: 'Recognise automatically (ISO 8601 or epoch milliseconds)',
  ...TIME_LAYOUT_LABELS,
  pattern: 'A pattern of my own…',
};

function ColumnSelect({ label, header, value, onChange }: { label: string; header: string[]; value: string; onChange: (v: string) => void }) {
  return (
    <SelectField label={label} value={value} onChange={(e) => onChange(e.target.value)}>
      <option value="">Choose a column…</option>
      {header.map((h) => (
        <option key={h} value={h}>
          {h}
        </option>
      ))}
    </SelectField>
  );
}

/**
 * How to read the file: delimiter, long or wide layout, which columns hold what (long: channel,
 * time and value; wide: the time column and, for every other column, a channel of this logger
 * or "skip"), the time format and the zone for times written without a UTC offset.
 */
export function ColumnMapping({
  header,
  channels,
  setup,
  onChange,
}: {
  header: string[];
  channels: MappingChannel[];
  setup: UploadSetup;
  onChange: (next: UploadSetup) => void;
}) {
  const set = <K extends keyof UploadSetup>(key: K, value: UploadSetup[K]) => onChange({ ...setup, [key]: value });
  return (
    <div className="grid gap-5">
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField label="Delimiter" value={setup.delimiter} onChange={(e) => set('delimiter', e.target.value as Delimiter)}>
          {Object.entries(DELIMITER_LABELS).map(([d, label]) => (
            <option key={d} value={d}>
              {label}
            </option>
          ))}
        </SelectField>
        <fieldset>
          <legend className="block text-sm font-medium">Layout</legend>
          <div className="mt-2 grid gap-1 text-sm">
            {(
              [
                ['long', 'Long: one reading per line (channel, time, value)'],
                ['wide', 'Wide: a time column and one column per channel'],
              ] as Array<[UploadFormat, string]>
            ).map(([format, label]) => (
              <label key={format} className="inline-flex items-center gap-2">
                <input
                  type="radio"
                  name="upload-format"
                  value={format}
                  checked={setup.format === format}
                  onChange={() => set('format', format)}
                  className="accent-lichen"
                />
                {label}
              </label>
            ))}
          </div>
        </fieldset>
      </div>

      <fieldset className="grid gap-4 rounded-xl border border-rule bg-card p-4 sm:grid-cols-3">
        <legend className="px-1 font-semibold">Columns</legend>
        <ColumnSelect label="Time column" header={header} value={setup.timeColumn} onChange={(v) => set('timeColumn', v)} />
        {setup.format === 'long' ? (
          <>
            <ColumnSelect label="Channel column" header={header} value={setup.channelColumn} onChange={(v) => set('channelColumn', v)} />
            <ColumnSelect label="Value column" header={header} value={setup.valueColumn} onChange={(v) => set('valueColumn', v)} />
          </>
        ) : (
          <div className="grid gap-3 sm:col-span-3 sm:grid-cols-3">
            {header
              .filter((h) => h !== setup.timeColumn)
              .map((h) => (
                <SelectField
                  key={h}
                  label={`Column “${h}”`}
                  value={setup.columns[h] ?? ''}
                  onChange={(e) => set('columns', { ...setup.columns, [h]: e.target.value || null })}
                >
                  <option value="">Skip this column</option>
                  {channels.map((c) => (
                    <option key={c.key} value={c.key}>
                      {c.key} — {c.label}
                    </option>
                  ))}
                </SelectField>
              ))}
          </div>
        )}
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField label="Time format" value={setup.timeFormat} onChange={(e) => set('timeFormat', e.target.value as TimeFormat)}>
          {Object.entries(TIME_FORMAT_LABELS).map(([f, label]) => (
            <option key={f} value={f}>
              {label}
            </option>
          ))}
        </SelectField>
        {setup.timeFormat === 'pattern' && (
          <TextField
            label="Pattern of the time column"
            hint="Letters: yyyy or yy year, MM or M month, dd or d day, HH or H hour (24 h), hh or h with a for AM/PM, mm minutes, ss seconds, SSS milliseconds; text in 'quotes' is matched as written."
            placeholder="dd.MM.yyyy HH:mm"
            value={setup.timePattern ?? ''}
            onChange={(e) => set('timePattern', e.target.value)}
          />
        )}
        <TimeZoneSelect
          label="Time zone of times without offset"
          hint="Used only for times like 2026-05-01 14:30 that carry no Z or ±hh:mm."
          current={setup.timeZone}
          value={setup.timeZone}
          onChange={(e) => set('timeZone', e.target.value)}
        />
      </div>
    </div>
  );
}
