/** The fields of a channel that say what it measures. */
export interface MeasuredThing {
  label: string;
  key: string;
  quantity: string | null;
  unit: string | null;
}

const COLD_STORE = /\b(freezers?|cold[\s-]?rooms?|incubators?|fridges?|refrigerators?|cryo\w*|ult)\b/i;
const TEMPERATURE = /\b(temp\w*)\b|°\s?[CFK]\b|\bdeg/i;
const GAS = /\b(gas|co2|co₂|carbon dioxide|carbon monoxide|co|o2|o₂|oxygen|methane|ch4|ammonia|nh3|nitrogen|n2|h2s|hydrogen|argon|ozone)\b/i;
const DISSOLVED = /\bdissolved\b/i;
/** The abbreviation only in capitals: "do" is an ordinary word. */
const DISSOLVED_OXYGEN_ABBREVIATION = /\bDO\b/;

/**
 * Whether a channel looks like the temperature of a freezer, cold room or incubator, or a gas
 * concentration: readings whose failure can hurt people or samples, where the page reminds that
 * Lagbook is not a certified alarm. Decided from the channel's quantity, label and key (common
 * practice: lab safety rules treat these as monitored hazards); dissolved gases in water are not
 * counted as gas hazards.
 */
export function needsSafetyCaution(c: MeasuredThing): boolean {
  const words = [c.quantity ?? '', c.label, c.key.replace(/_/g, ' ')].join(' ');
  if (COLD_STORE.test(words) && (TEMPERATURE.test(`${words} ${c.unit ?? ''}`) || !c.unit)) return true;
  return GAS.test(words) && !DISSOLVED.test(words) && !DISSOLVED_OXYGEN_ABBREVIATION.test(words);
}
