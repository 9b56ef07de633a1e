/** Exit codes of every command: 0 ok, 1 a check found a difference, 2 bad input, 3 unconverged or untrusted result. */
export const EXIT = { ok: 0, differs: 1, badInput: 2, untrusted: 3 } as const;
