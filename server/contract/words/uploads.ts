/**
 * Words of file uploads (reading options, the time preview): field labels and the reasons their
 * checks give. Shared by the contract, the upload service and the client's upload form.
 */

/** Fields of an upload's reading options and of the time preview. */
export const UPLOAD_LABELS = {
  options: 'Reading options',
  format: 'File layout',
  delimiter: 'Column separator',
  timeColumn: 'Time column',
  channelColumn: 'Channel column',
  valueColumn: 'Value column',
  columns: 'Columns and their channels',
  timeFormat: 'Layout of the times',
  timePattern: 'Pattern of the times',
  timeZone: 'Time zone of the times',
  samples: 'Sample times',
} as const;

/** Reasons the upload checks give. */
export const UPLOAD_REASONS = {
  format: 'must be long (one reading a line) or wide (one column a channel)',
  delimiter: 'must be a comma, a semicolon or a tab',
  timeColumn: 'must name a column',
  timeFormat: 'must be one of the time layouts the upload form lists',
  longNeedsColumns: 'a long file needs its channel column and its value column named',
  wideNeedsChannel: 'a wide file needs at least one column stored under a channel',
  patternNeeded: 'give the pattern of the time column, e.g. dd.MM.yyyy HH:mm',
  zoneNeeded: "these times carry no offset from UTC: name the zone they are in (usually the logger's own)",
  optionsJson: 'could not be read (the form sends them; a script must send them as JSON)',
  samplesText: 'must be a list of time texts',
  samplesMin: 'give at least one time text',
} as const;
