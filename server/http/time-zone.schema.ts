import { z } from 'zod';
import { isKnownTimeZone } from '../policies/time-zones.ts';

/** An IANA time zone name the platform knows ("Europe/Berlin", "UTC"). */
export const timeZoneSchema = z.string().trim().refine(isKnownTimeZone, 'must be an IANA time zone such as Europe/Berlin or UTC');
