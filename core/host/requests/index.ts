import { appRequests } from './app';
import { demoRequests } from './demo';

/**
 * Every request of the host API, by name. Each area adds its own table (one file in this
 * folder) and spreads it here; shells (CLI, Electron IPC, loopback HTTP) call through `Host`.
 */
export const requests = {
  ...appRequests,
  ...demoRequests,
};

export type Requests = typeof requests;
export type RequestName = keyof Requests;
