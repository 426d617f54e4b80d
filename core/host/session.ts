/**
 * What a shell tells the renderer about where it runs, without naming the shell: the
 * catalogue it opened (if any), where the demo assemblage lives, and what it can do
 * besides host requests. The renderer adapts to capabilities, never to a shell's name.
 */
export interface ShellSession {
  /** Absolute path of the catalogue the shell opened, or null to show the first-run screen. */
  catalogue: string | null;
  /** Path of the demo catalogue, when this installation has one (or can build one). */
  demoCatalogue: string | null;
  /** Catalogues opened recently, newest first. */
  recent: string[];
  /** The shell can show native file dialogs (otherwise the renderer asks for a path). */
  canPickFiles: boolean;
  /** Every host request this shell answers, with its one-line summary. */
  requests: Array<{ name: string; summary: string }>;
}
