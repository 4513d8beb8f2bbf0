// The formula of one cell, editable in place. Typing recalculates after a short pause; Enter
// commits at once; Escape brings back the text from before the edit. One edit of a row (focus to
// Enter or blur) is one undo step however many pauses it had. Half-typed text that cannot be read
// yet is not sent to the sheet while typing (plots and dependents keep their last good values); the
// reason shows at the row, and Enter or leaving the box stores the text as typed anyway.
import { createEffect, createMemo, createSignal, For, on, onCleanup, Show } from 'solid-js';
import { useServices } from '../app/services';
import { callAroundCaret, completionsFor, wordBeforeCaret, type Completion } from '../help/formulaContext';
import { BuiltinSignature } from '../help/BuiltinSignature';
import { compileFormula } from '../../src/sheet/formulaCompiler';

export const RECALC_PAUSE_MS = 150;

export function FormulaBox(props: {
  name: string;
  formula: string;
  onCommit: (formula: string, group?: string) => void;
  onNavigate: (direction: -1 | 1) => void;
  /** A form's field instead of a row's: no commits; every change goes to onDraft, Enter to onSubmit. */
  field?: { inputName: string; label: string; placeholder?: string; onDraft: (text: string) => void; onSubmit: () => void; value: () => string };
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
  // The text when the box got focus, and the undo group of this edit.
  let textAtFocus = props.formula;
  let group: string | undefined;

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
    if (props.field) return;
    if (text !== lastCommitted) {
      lastCommitted = text;
      props.onCommit(text, group);
    }
  };
  const endEdit = () => {
    commitNow();
    if (group) services.session.closeGroup(group);
    group = undefined;
  };
  onCleanup(() => endEdit());

  /** Why the text being typed cannot be read yet (syntax only), or null. */
  const draftProblem = createMemo(() => {
    const text = draft();
    if (!focused() || text === props.formula) return null;
    const c = compileFormula(text, props.name);
    return c.kind === 'error' && c.error.kind === 'syntax' ? c.error.message : null;
  });

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
    // A call gets its opening parenthesis, unless one follows the caret already (never doubled).
    const rest = text.slice(caret());
    const insert = c.kind === 'cell' || /^\s*\(/.test(rest) ? c.name : `${c.name}(`;
    const next = text.slice(0, w.start) + insert + rest;
    setDraft(next);
    props.field?.onDraft(next);
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
      if (!draftProblem()) commitNow();
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
    if (e.key === 'Enter' && props.field) {
      e.preventDefault();
      props.field.onSubmit();
    } else if (e.key === 'Enter') {
      e.preventDefault();
      endEdit();
      props.onNavigate(1);
    } else if (e.key === 'Escape') {
      e.preventDefault();
      if (timer !== undefined) clearTimeout(timer);
      timer = undefined;
      // Back to the text from before this edit, in the sheet too (the edit's undo step goes away).
      setDraft(textAtFocus);
      commitNow();
    } else if (e.key === 'ArrowDown' || e.key === 'ArrowUp') {
      e.preventDefault();
      endEdit();
      props.onNavigate(e.key === 'ArrowDown' ? 1 : -1);
    }
  };

  return (
    <div class="formula-box">
      <input
        ref={input}
        class="formula-input"
        data-formula={props.field ? undefined : props.name}
        name={props.field?.inputName}
        placeholder={props.field?.placeholder}
        spellcheck={false}
        autocomplete="off"
        aria-label={props.field ? props.field.label : `Formula of ${props.name}`}
        value={props.field ? props.field.value() : draft()}
        title={draft()}
        onInput={(e) => {
          setDraft(e.currentTarget.value);
          props.field?.onDraft(e.currentTarget.value);
          setCaret(e.currentTarget.selectionStart ?? 0);
          setChoice(0);
          setCompletionClosed(false);
          schedule();
        }}
        onKeyUp={(e) => setCaret(e.currentTarget.selectionStart ?? 0)}
        onClick={(e) => setCaret(e.currentTarget.selectionStart ?? 0)}
        onFocus={(e) => {
          textAtFocus = props.formula;
          group = `${props.name}:${Math.random().toString(36).slice(2)}`;
          setFocused(true);
          setCaret(e.currentTarget.selectionStart ?? 0);
        }}
        onBlur={() => {
          endEdit();
          setFocused(false);
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
      <Show when={draftProblem()}>
        {(message) => (
          <div class="cell-error draft-error" role="status" data-draft-error>
            {props.field ? 'cannot be read yet' : 'not stored yet (Enter stores it as typed)'}: {message()}
          </div>
        )}
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
