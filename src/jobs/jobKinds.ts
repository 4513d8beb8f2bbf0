// Every parallel job kind a worker can run. A new kind (realise, infer, ...) adds one line here.
import { registerChunkedJob } from './chunkedJob';
import { scan1dJob } from '../statistics/scan1dJob';
import { scan2dJob } from '../statistics/scan2dJob';
import { monteCarloJob } from '../statistics/monteCarloJob';
import { inferBatchJob } from '../statistics/inferBatchJob';
import { realiseJob } from '../statistics/realiseJob';
import { spectrumSampleJob } from '../statistics/spectrumMonteCarloJob';

export function registerJobKinds(): void {
  registerChunkedJob(scan1dJob);
  registerChunkedJob(scan2dJob);
  registerChunkedJob(monteCarloJob);
  registerChunkedJob(inferBatchJob);
  registerChunkedJob(realiseJob);
  registerChunkedJob(spectrumSampleJob);
}
