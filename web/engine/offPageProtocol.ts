// Messages between the page and the off-page worker (offPageWorker.ts): plain data.
import type { TransferredState } from '../../src/sheet/valueTransfer';

/** Evaluate `name` given the file text of it and every cell it reads (Sheet.closureText). */
export interface OffPageRequest {
  id: number;
  name: string;
  text: string;
}

export interface OffPageReply {
  id: number;
  state: TransferredState;
  elapsedMs: number;
}
