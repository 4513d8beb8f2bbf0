// The formula of one cell, editable in place. Typing recalculates after a short pause; Enter
// commits at once; Escape brings back the formula the sheet holds. The user's text is kept as typed.
import { createEffect, createMemo, createSignal, For, on, onCleanup, Show } from 'solid-js';
import { useServices } from '../app/services';
import { callAroundCaret, completionsFor, wordBeforeCaret, type Completion } from '../help/formulaContext';
import { BuiltinSignature } from '../help/BuiltinSignature';

export const RECALC_PAUSE_MS = 150;

export function FormulaBox(props: {
  name: string;
  formula: string;
  onCommit: (formula: string) => void;
  onNavigate: (direction: -1 | 1) => void;
}) {
  const services = useServices();
  const [draft, setDraft] = createSignal(props.formula);
  const [caret, setCaret] = createSignal(0);
  const [focused, setFocused] = createSignal(false);
  const [choice, setChoice] = createSignal(0);
  const [completionClosed, setCompletionClosed] = createSignal(false);
  let input!: HTMLInputElement;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let lastCommitted = props.formula;

  // When the sheet's formula changes from elsewhere (undo, open, rename), show it unless the user
  // is in the middle of typing something else.
  createEffect(
    on(
      () => props.formula,
      (f) => {
        if (f === lastCommitted) return;
        lastCommitted = f;
        if (timer === undefined) setDraft(f);
      },
      { defer: true },
    ),
  );

  const commitNow = () => {
    if (timer !== undefined) clearTimeout(timer);
    timer = undefined;
    const text = draft();
    if (text !== lastCommitted) {
      lastCommitted = text;
      props.onCommit(text);
    }
  };
  onCleanup(() => commitNow());

  const word = createMemo(() => (focused() ? wordBeforeCaret(draft(), caret()) : null));
  const options = createMemo<Completion[]>(() => {
    const w = word();
    if (!w || completionClosed()) return [];
    return completionsFor(w.word, services.completions()).filter((c) => c.name !== props.name);
  });
  const call = createMemo(() => (focused() ? callAroundCaret(draft(), caret()) : null));
  const callHelp = createMemo(() => {
    const c = call();
    return c ? services.builtins().find((b) => b.name === c.name) : undefined;
  });

  const accept = (c: Completion) => {
    const w = word();
    if (!w) return;
    const text = draft();
    const insert = c.kind === 'cell' ? c.name : `${c.name}(`;
    const next = text.slice(0, w.start) + insert + text.slice(caret());
    setDraft(next);
    const pos = w.start + insert.length;
    queueMicrotask(() => {
      input.setSelectionRange(pos, pos);
      setCaret(pos);
    });
    schedule();
  };

  const schedule = () => {
    if (timer !== undefined) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = undefined;
      commitNow();
    }, RECALC_PAUSE_MS);
  };

  const onKeyDown = (e: KeyboardEvent) => {
    const opts = options();
    if (opts.length) {
      if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
        e.preventDefault();
        setChoice((i) => (i + (e.key === 'ArrowDown' ? 1 : -1) + opts.length) % opts.length);
        return;
      }
      if (e.key === 'Tab' || (e.key === 'Enter' && !e.ctrlKey)) {
        e.preventDefault();
        accept(opts[Math.min(choice(), opts.length - 1)]);
        return;
      }
      if (e.key === 'Escape') {
        e.preventDefault();
        setCompletionClosed(true);
        return;
      }
    }
    if (e.key === 'Enter') {
      e.preventDefault();
      commitNow();
      props.onNavigate(1);
    } else if (e.key === 'Escape') {
      e.preventDefault();
      if (timer !== undefined) clearTimeout(timer);
      timer = undefined;
      setDraft(lastCommitted);
    } else if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
      e.preventDefault();
      commitNow();
      props.onNavigate(e.key === 'ArrowDown' ? 1 : -1);
    }
  };

  return (
    <div class="formula-box">
      <input
        ref={input}
        class="formula-input"
        data-formula={props.name}
        spellcheck={false}
        autocomplete="off"
        aria-label={`Formula of ${props.name}`}
        value={draft()}
        title={draft()}
        onInput={(e) => {
          setDraft(e.currentTarget.value);
          setCaret(e.currentTarget.selectionStart ?? 0);
          setChoice(0);
          setCompletionClosed(false);
          schedule();
        }}
        onKeyUp={(e) => setCaret(e.currentTarget.selectionStart ?? 0)}
        onClick={(e) => setCaret(e.currentTarget.selectionStart ?? 0)}
        onFocus={(e) => {
          setFocused(true);
          setCaret(e.currentTarget.selectionStart ?? 0);
        }}
        onBlur={() => {
          setFocused(false);
          commitNow();
        }}
        onKeyDown={onKeyDown}
      />
      <Show when={options().length}>
        <ul class="completions" role="listbox" aria-label="Names">
          <For each={options()}>
            {(c, i) => (
              <li
                role="option"
                aria-selected={i() === choice()}
                classList={{ chosen: i() === choice() }}
                onMouseDown={(e) => {
                  e.preventDefault();
                  accept(c);
                }}
              >
                <span class="completion-name">{c.name}</span>
                <span class="completion-kind">{c.kind}</span>
                <span class="completion-detail">{c.detail}</span>
              </li>
            )}
          </For>
        </ul>
      </Show>
      <Show when={callHelp()}>
        {(b) => (
          <div class="call-help" role="note">
            <BuiltinSignature builtin={b()} activeArg={call()?.argIndex} />
          </div>
        )}
      </Show>
    </div>
  );
}
