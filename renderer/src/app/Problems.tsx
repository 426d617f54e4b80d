import { ApiError } from '../api/client';

/** The problems of a failed request, one line each, with where they were found. */
export function Problems({ error }: { error: unknown }) {
  if (!error) return null;
  const problems =
    error instanceof ApiError ? error.problems : [{ message: error instanceof Error ? error.message : String(error) }];
  return (
    <ul className="problems" role="alert">
      {problems.map((p, i) => (
        <li key={i}>
          {'line' in p && p.line !== undefined ? <span className="where">line {p.line}{'column' in p && p.column !== undefined ? `, ${p.column}` : ''}: </span> : null}
          {p.message}
        </li>
      ))}
    </ul>
  );
}
