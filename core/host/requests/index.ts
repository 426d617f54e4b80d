import { appRequests } from './app';
import { catalogueRequests } from './catalogue';
import { proposalRequests } from './proposals';

/**
 * Every request of the host API, by name. Each area adds its own table (one file in this
 * folder) and spreads it here; shells (CLI, Electron IPC, loopback HTTP) call through `Host`.
 */
export const requests = {
  ...appRequests,
  ...catalogueRequests,
  ...proposalRequests,
};

export type Requests = typeof requests;
export type RequestName = keyof Requests;
