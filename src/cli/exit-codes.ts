/**
 * Exit codes of every command: 0 ok, 1 a check found a difference, 2 bad input, 3 unconverged or untrusted result,
 * 4 the system could not store the output (disk full, quota, I/O error; `io`). A closed output pipe (e.g.
 * `dispole species | head -1`) ends quietly with 0, as other command-line tools do; 70 is an internal error.
 */
export const EXIT = { ok: 0, differs: 1, badInput: 2, untrusted: 3, io: 4 } as const;
