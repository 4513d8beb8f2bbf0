// What the components share: the live sheet, messages, row focus and the help topic.
import { createContext, useContext, type Accessor } from 'solid-js';
import type { SheetSession } from '../state/sheetSession';
import type { BuiltinDoc } from '../help/builtinDocs';
import type { Completion } from '../help/formulaContext';

export type Tone = 'info' | 'error';

export interface Services {
  session: SheetSession;
  notify(text: string, tone?: Tone): void;
  /** Moves keyboard focus to a cell's formula box (and scrolls it into view). */
  focusCell(name: string, part?: 'formula' | 'name'): void;
  /** Scrolls a cell's row into view (drawing it in a long sheet) without moving the focus; false when there is no such row. */
  showCell(name: string): boolean;
  /** The cell the find bar is showing (its row is marked). */
  found: Accessor<string | null>;
  setFound(name: string | null): void;
  registerRow(name: string, el: HTMLElement | undefined): void;
  /** Set by the sheet panel: scrolls a row that is not drawn (a long sheet draws the rows in view) into view, drawing it. */
  revealRow?: (name: string) => void;
  /** Cell names in screen order, for keyboard navigation. */
  rowOrder(): string[];
  /** The built-ins' documentation (loaded on first use; empty until then). */
  builtins: Accessor<readonly BuiltinDoc[]>;
  completions: Accessor<Completion[]>;
  /** The cell whose trace is open. */
  traced: Accessor<string | null>;
  setTraced(name: string | null): void;
  /** The docs page shown in the Docs tab (docs/PAGE.md), and the heading asked for. */
  docPage: Accessor<DocLocation>;
  /** Shows a docs page (shipped with the app) in the side panel's Docs tab. */
  openDoc(page: string, anchor?: string): void;
}

export interface DocLocation {
  page: string;
  anchor?: string;
}

const ServicesContext = createContext<Services>();
export const ServicesProvider = ServicesContext.Provider;

export function useServices(): Services {
  const s = useContext(ServicesContext);
  if (!s) throw new Error('Strainsheet: component used outside the workbench');
  return s;
}
