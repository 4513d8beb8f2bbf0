// The messages at the corner of the screen: a message repeated while it is shown is merged into the
// one already there (with a count) instead of stacking up; each is dismissed on its own.
import type { Tone } from './services';

export interface Message {
  id: number;
  text: string;
  tone: Tone;
  /** How many times this message was given while it was shown. */
  count: number;
}

/** Messages shown at once; older ones give way. */
export const MAX_MESSAGES = 4;

/** The list after a message is given: merged with an equal one (moved to the end), or added. */
export function withMessage(list: readonly Message[], text: string, tone: Tone, id: number): { list: Message[]; shown: Message } {
  const same = list.find((m) => m.text === text && m.tone === tone);
  if (same) {
    const shown = { ...same, count: same.count + 1 };
    return { list: [...list.filter((m) => m !== same), shown], shown };
  }
  const shown = { id, text, tone, count: 1 };
  return { list: [...list.slice(-(MAX_MESSAGES - 1)), shown], shown };
}
