/**
 * Words the upload screens write themselves (checks of the reading options before a file is
 * sent, file problems, the connection lost mid-upload). This file is the one place to review how
 * the uploads feature speaks to people; field labels and the reasons the server shares live in
 * `@shared/contract/words/uploads.ts`.
 */

export const UPLOAD_MESSAGES = {
  /** A long file's time, channel and value columns must differ (said before the schema's checks). */
  threeDifferentColumns: 'Columns: time, channel and value must be three different columns.',
  notACsv: 'This does not look like a CSV file with a header line and at least two columns.',
  connectionLost: 'The connection was lost. What was stored is kept; send the file again to finish (stored rows count as duplicates).',
  cancelled: 'The upload was cancelled. What was stored before that is kept.',
} as const;

/** The server refused the upload without its own words (the status code is for whoever helps). */
export const uploadRefused = (status: number): string => `The upload was refused (answer ${status} from the server).`;
