// Messages for the user (opened files, refused files, storage): errors stay until dismissed, notes
// go after a while; a repeated message shows its count instead of appearing again.
import { createSignal, For, Show } from 'solid-js';
import type { Tone } from './services';
import { withMessage, type Message } from './messageList';
import { printable } from '../files/binaryContent';

/** Longer messages are cut (the reason comes first in every message). */
const MAX_MESSAGE_CHARS = 1200;

/** How long a note (not an error) stays. */
const INFO_MS = 8000;

export function createMessages() {
  const [messages, setMessages] = createSignal<Message[]>([]);
  const timers = new Map<number, ReturnType<typeof setTimeout>>();
  let nextId = 1;
  const dismiss = (id: number) => {
    clearTimeout(timers.get(id));
    timers.delete(id);
    setMessages((m) => m.filter((x) => x.id !== id));
  };
  const notify = (raw: string, tone: Tone = 'info') => {
    // Whatever a message quotes (a file's name or content, a parser's excerpt), no control
    // character or undecodable byte reaches the screen.
    const text = printable(raw, MAX_MESSAGE_CHARS);
    const { list, shown } = withMessage(messages(), text, tone, nextId);
    if (shown.id === nextId) nextId++;
    for (const id of timers.keys()) if (!list.some((m) => m.id === id)) dismiss(id);
    setMessages(list);
    if (tone === 'info') {
      clearTimeout(timers.get(shown.id));
      timers.set(shown.id, setTimeout(() => dismiss(shown.id), INFO_MS));
    }
  };
  return { messages, notify, dismiss };
}

export function MessageList(props: { messages: Message[]; onDismiss: (id: number) => void }) {
  return (
    <div class="messages" aria-live="polite">
      <For each={props.messages}>
        {(m) => (
          <div class={`message ${m.tone}`} role={m.tone === 'error' ? 'alert' : 'status'} data-message-count={m.count}>
            <span class="message-text">{m.text}</span>
            <Show when={m.count > 1}>
              <span class="message-count" title={`given ${m.count} times`}>
                ×{m.count}
              </span>
            </Show>
            <button type="button" class="dismiss" aria-label="Dismiss this message" title="Dismiss" onClick={() => props.onDismiss(m.id)}>
              ×
            </button>
          </div>
        )}
      </For>
    </div>
  );
}
