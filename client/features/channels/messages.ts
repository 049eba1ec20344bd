/**
 * Words the channel screens write themselves (refusals of a choice, empty states). This file is
 * the one place to review how the channels feature speaks to people; field labels the server
 * shares live in `@shared/contract/words/channels.ts`.
 */

/** A channel ticked beyond what one chart of channels together draws. */
export function tooManyTogether(max: number, channelName: string): string {
  return `One chart takes at most ${max} channels: ${channelName} was not added. Untick one of the ${max} to choose it instead.`;
}
