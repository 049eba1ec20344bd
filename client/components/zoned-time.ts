/**
 * Moved to `./clock/format.ts` (one copy of the zone primitives). This file only forwards the
 * names for the importers that have not switched yet; import from `./clock/format.ts` instead.
 */
export { formatOffset, formatZoned, fromZonedInput, toZonedInput, zoneOffsetLabel, zoneOffsetMinutes } from './clock/format.ts';
