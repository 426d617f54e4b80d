import { createContext, useContext } from 'react';
import type { ApiClient, ShellSession } from '../api/client';

/** What every screen may use: the API client, the open catalogue and a way to say data changed. */
export interface Workspace {
  client: ApiClient;
  session: ShellSession;
  /** Absolute path of the open catalogue. */
  catalogue: string;
  /** Goes up whenever a screen changed the catalogue, so other views reload. */
  revision: number;
  changed(): void;
  /** True when the host answers this request (areas land at different times). */
  has(name: string): boolean;
  /** Show a short message in the status line. */
  say(message: string, tone?: 'info' | 'error'): void;
  open(screen: ScreenName, specimen?: number): void;
  /** Review decisions taken in this session, newest last, kept across screens for undo. */
  decisions: ReviewDecision[];
  setDecisions(update: (d: ReviewDecision[]) => ReviewDecision[]): void;
}

export interface ReviewDecision {
  kind: 'accept' | 'reject';
  join: { id: number; a: string; b: string };
}

export type ScreenName = 'catalogue' | 'specimen' | 'review' | 'refits' | 'counts' | 'site';

export const WorkspaceContext = createContext<Workspace | null>(null);

export function useWorkspace(): Workspace {
  const w = useContext(WorkspaceContext);
  if (!w) throw new Error('useWorkspace outside a catalogue');
  return w;
}
