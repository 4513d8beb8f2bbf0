// On narrow screens the workspace shows the sheet or the side panel: this switch, always on
// screen, brings either one in a click (hidden by CSS when both fit side by side).
export type WorkspaceView = 'sheet' | 'side';

export function ViewSwitch(props: { view: WorkspaceView; onView: (v: WorkspaceView) => void }) {
  const item = (v: WorkspaceView, label: string) => (
    <button type="button" class="view-button" data-view-button={v} aria-pressed={props.view === v} onClick={() => props.onView(v)}>
      {label}
    </button>
  );
  return (
    <nav class="view-switch no-print" aria-label="Workspace view">
      {item('sheet', 'Sheet')}
      {item('side', 'Plots & tools')}
    </nav>
  );
}
