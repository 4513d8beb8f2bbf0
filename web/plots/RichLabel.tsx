// A short label in the trade's notation on screen (h_c, Ω_gw, ρ_k with real subscripts), from the
// same runs as the figures (figureText.ts).
import { For, Match, Switch } from 'solid-js';
import { richRuns } from './figureText';

export function RichLabel(props: { text: string }) {
  return (
    <For each={richRuns(props.text)}>
      {(r) => (
        <Switch fallback={r.text}>
          <Match when={r.shift === 'sub'}>
            <sub>{r.text}</sub>
          </Match>
          <Match when={r.shift === 'super'}>
            <sup>{r.text}</sup>
          </Match>
        </Switch>
      )}
    </For>
  );
}
