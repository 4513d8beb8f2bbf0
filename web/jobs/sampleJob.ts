// Monte Carlo sampling of the uncertain cells (filled in once src/statistics has its sampler).
import type { Sheet } from '../../src/sheet/sheet';
import type { JobSpec, SampleResult } from './jobProtocol';
import type { JobControl } from './jobRunner';

export async function runSampleJob(_sheet: Sheet, _job: Extract<JobSpec, { kind: 'sample' }>, _ctl: JobControl): Promise<SampleResult> {
  throw new Error('Monte Carlo sampling is not available in this build yet');
}
