// Entry point of the web app: mounts the workbench on #root.
import { demoSettled } from './app/demoSheet'; // first, so that the demo's text is asked for while the rest loads
import { render } from 'solid-js/web';
import { Workbench } from './app/Workbench';

performance.mark('strainsheet:boot');
// The demo's text (when the page starts on it) arrives before the first render, so that the session
// evaluates A_yr before the sheet is drawn, as it does a sheet already in the page (not an empty
// sheet replaced a task later).
await demoSettled();
const root = document.getElementById('root');
if (!root) throw new Error('Strainsheet: #root element missing from index.html');
render(() => <Workbench />, root);
