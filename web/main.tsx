// Entry point of the web app: mounts the workbench on #root.
import { render } from 'solid-js/web';
import { Workbench } from './app/Workbench';

performance.mark('strainsheet:boot');
const root = document.getElementById('root');
if (!root) throw new Error('Strainsheet: #root element missing from index.html');
render(() => <Workbench />, root);
