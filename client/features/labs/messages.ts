/**
 * Words the lab screens and the lab switcher in the top band write themselves. This file is the
 * one place to review how the labs feature speaks to people; field labels the server shares
 * live in `@shared/contract/words/labs.ts`.
 */

/** What the lab switcher says, inside a lab and on the pages that belong to no lab. */
export const SWITCHER_WORDS = {
  /** Small word before the lab's name when a lab is open. */
  inLab: 'Lab',
  /** The button's words outside a lab, when the person has labs to go to. */
  goToLab: 'Go to a lab',
  /** The button's words for someone with no lab. */
  noLabYet: 'No lab yet',
  /** The list of the person's labs. */
  yourLabs: 'Your labs',
  createLab: '+ Create a lab',
} as const;

/**
 * The pages outside any lab, as the switcher names the place the person is on (so it never
 * asks them to "choose" a lab where none is chosen or needed).
 */
export const PLACES_OUTSIDE_LABS = {
  home: 'Start page',
  account: 'Your account',
  apiReference: 'API reference',
  createLab: 'New lab',
  joinLab: 'Invitation',
  /** A lab address that is not one of the person's labs (gone, or never theirs). */
  otherLab: 'Not one of your labs',
  elsewhere: 'Outside your labs',
} as const;
