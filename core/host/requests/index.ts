import { appRequests } from './app';
import { demoRequests } from './demo';
import { joinsRequests } from './joins';
import { tallyRequests } from './tally';
import { catalogueRequests } from './catalogue';
import { proposalRequests } from './proposals';
import { scanRequests } from './scans';
import { specimenTableRequests } from './specimen-table';
import { spatialRequests } from './spatial';
import { reviewRequests } from './review';
import { viewerRequests } from './viewer';
import { vocabularyRequests } from './vocabulary';

/**
 * Every request of the host API, by name. Each area adds its own table (one file in this
 * folder) and spreads it here; shells (CLI, Electron IPC, loopback HTTP) call through `Host`.
 */
export const requests = {
  ...appRequests,
  ...demoRequests,
  ...joinsRequests,
  ...tallyRequests,
  ...catalogueRequests,
  ...proposalRequests,
  ...scanRequests,
  ...spatialRequests,
  ...vocabularyRequests,
  ...viewerRequests,
  ...reviewRequests,
  ...specimenTableRequests,
};

export type Requests = typeof requests;
export type RequestName = keyof Requests;
