/** Browser implementation of the workbench services (workers, fetch of the demo, IndexedDB). */
import type { WorkbenchServices } from './services.ts';

const notYet = (what: string) => () => Promise.reject(new Error(`${what} is not available yet`));

export const browserServices: WorkbenchServices = {
  readRecording: notYet('Reading recordings'),
  readDecomposition: notYet('Reading decompositions'),
  computeDecomposition: notYet('Computing a decomposition'),
  computeEvidence: notYet('Computing evidence'),
  demoInput: notYet('The demo participant'),
  loadReview: () => Promise.resolve(null),
  saveReview: () => Promise.resolve(),
};
