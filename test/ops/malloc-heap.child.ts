/**
 * Child process of malloc-heap.test.ts: `<raise: 0|1> <blocks> <block bytes>`. Optionally raises glibc's
 * thresholds (src/malloc-heap.ts), then allocates rounds of blocks, writes them and frees them all at once
 * (moved into a message to a closed port, which drops them); prints the minor page faults of rounds 2–6.
 */

import { MessageChannel } from 'node:worker_threads';
import { raiseMallocThresholds } from '../../src/malloc-heap.js';

const [blockCount, blockBytes] = [Number(process.argv[3]), Number(process.argv[4])];
// A dropped message is freed after a turn of the loop (50 ms: room on a loaded machine).
const turn = () => new Promise((resolve) => setTimeout(resolve, 50));
const free = (buffers: ArrayBuffer[]) => {
  const { port1, port2 } = new MessageChannel();
  port2.close();
  port1.postMessage(buffers, buffers);
  port1.close();
};
const round = () => {
  const blocks: ArrayBuffer[] = [];
  for (let i = 0; i < blockCount; i++) blocks.push(Buffer.allocUnsafeSlow(blockBytes).fill(i).buffer as ArrayBuffer);
  free(blocks);
};

if (process.argv[2] === '1') raiseMallocThresholds();
await turn();
round(); // the first round faults its pages in either way
await turn();
const before = process.resourceUsage().minorPageFault;
for (let i = 0; i < 5; i++) {
  round();
  await turn();
}
process.stdout.write(String(process.resourceUsage().minorPageFault - before));
