import { z } from 'zod';

/**
 * The messages between the renderer's preload and the main process. Every message the
 * main process receives is checked against these schemas before anything else happens.
 */
export const CHANNELS = {
  call: 'knitbone:call',
  cancel: 'knitbone:cancel',
  progress: 'knitbone:progress',
  session: 'knitbone:session',
  pickFile: 'knitbone:pick-file',
} as const;

export const CallMessage = z
  .object({
    name: z.string().regex(/^[a-z][a-zA-Z0-9.-]{0,80}$/, 'a request name such as "specimens.list"'),
    input: z.unknown(),
    callId: z.string().regex(/^c[0-9]{1,12}$/),
  })
  .strict();

export const CancelMessage = z.string().regex(/^c[0-9]{1,12}$/);

export const PickPurpose = z.enum(['open-catalogue', 'new-catalogue', 'import-csv', 'import-scans']);
export type PickPurpose = z.infer<typeof PickPurpose>;

/** Where the app's own pages live; nothing else may be loaded or call the main process. */
export const APP_SCHEME = 'knitbone';
export const APP_ORIGIN = `${APP_SCHEME}://app`;
