import { readFileSync } from 'node:fs';

/**
 * A reference fixture as the R or statsmodels script beside it wrote it: JSON whose shape the
 * script defines and each test reads field by field. Left as `any` on purpose: the assertions,
 * not a type, check every value read from it, and restating the scripts' output as interfaces
 * would be a second copy to keep in step.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- untyped fixture JSON, see above
export type ReferenceJson = Record<string, any>;

/** Reads `tests/reference/fixtures/<name>`, written by the reference scripts in tests/reference/. */
export function loadReferenceFixture(name: string): ReferenceJson {
  return JSON.parse(readFileSync(new URL(`./fixtures/${name}`, import.meta.url), 'utf8'));
}
