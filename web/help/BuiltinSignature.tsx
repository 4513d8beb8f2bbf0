// One built-in as help text: call form with argument units, what it returns, and its source.
import { For, Show } from 'solid-js';
import type { BuiltinDoc } from './builtinDocs';
import { LinkedText } from './LinkedText';

export function BuiltinSignature(props: { builtin: BuiltinDoc; activeArg?: number }) {
  return (
    <div class="builtin-sig">
      <div class="sig-line">
        <code class="sig-name">{props.builtin.name}</code>
        <span class="sig-paren">(</span>
        <For each={props.builtin.args}>
          {(a, i) => (
            <>
              <Show when={i() > 0}>
                <span class="sig-comma">, </span>
              </Show>
              <span classList={{ 'sig-arg': true, active: props.activeArg === i(), optional: !!a.optional }} title={a.description}>
                {a.name}
                <span class="sig-unit"> [{a.unit}]</span>
                {a.optional ? '?' : ''}
              </span>
            </>
          )}
        </For>
        <span class="sig-paren">)</span>
        <span class="sig-returns"> → {props.builtin.returns.unit}</span>
      </div>
      <div class="sig-summary">{props.builtin.summary}</div>
      <Show when={props.activeArg !== undefined && props.builtin.args[props.activeArg!]}>
        {(a) => (
          <div class="sig-argdoc">
            <b>{a().name}</b>: {a().description}
          </div>
        )}
      </Show>
      <div class="sig-source">
        Source: <LinkedText text={props.builtin.source} />
      </div>
    </div>
  );
}
