/**
 * Sentences of the retention answer (`GET …/billing/retention`) for people who read the answer
 * itself (notebooks, scripts). They carry no times: the billing page writes its own sentence with
 * the times on the reader's clock.
 */
export const RETENTION_SENTENCES = {
  /** The plan keeps every reading. */
  keepsEverything: (planName: string, historyDays: number): string =>
    `The ${planName} plan never removes readings: it shows the last ${historyDays.toLocaleString('en')} days, and older readings stay stored and show again with a longer plan.`,
  /** The plan removes readings past its history plus the export days. */
  removes: (planName: string, historyDays: number, exportDays: number, readings: number): string =>
    `The ${planName} plan removes readings ${(historyDays + exportDays).toLocaleString('en')} days after they were taken (its ${historyDays.toLocaleString('en')} days of history and ${exportDays.toLocaleString('en')} more for exporting them); ${readings.toLocaleString('en')} ${readings === 1 ? 'reading is' : 'readings are'} due for removal. Export them first from the lab's settings.`,
} as const;
