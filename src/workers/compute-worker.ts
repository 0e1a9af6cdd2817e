/** Worker-thread entry of the compute pool (piscina calls the default export with each task). */

import { runComputeTask, type ComputeRequest, type ComputeResponse } from './tasks.js';

export default function computeWorker(request: ComputeRequest): Promise<ComputeResponse> {
  return runComputeTask(request);
}
