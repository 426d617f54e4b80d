/**
 * What is wrong with a mesh file, said in one sentence a user can act on. The geometry core
 * knows no file names; the caller (host request, CLI) adds the file to the message it shows.
 */
export class MeshFileError extends Error {
  /** 1-based line of a text file where the problem was found, when known. */
  readonly line?: number;

  constructor(message: string, line?: number) {
    super(message);
    this.name = 'MeshFileError';
    this.line = line;
  }
}
