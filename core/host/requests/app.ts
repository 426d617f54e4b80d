import { z } from 'zod';
import { defineRequest } from '../request';

const pkgVersion = '0.1.0';

/** Requests about the program itself. */
export const appRequests = {
  'app.about': defineRequest({
    summary: 'Name and version of this knitbone',
    input: z.object({}).strict(),
    run: () => ({ name: 'knitbone', version: pkgVersion }),
  }),
};
