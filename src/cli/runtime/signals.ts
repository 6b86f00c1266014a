/**
 * The signals that end a run (main.ts): temporary files are removed and the status is 128 + the
 * signal's number; a launcher with a child (hugePages.ts) passes them on. These are the ones a user, a
 * scheduler or a resource limit sends to stop a job. Left to their default action: SIGUSR1 (Node's
 * inspector) and SIGPROF (profilers), SIGPIPE and SIGXFSZ (Node ignores them: the write fails
 * instead), SIGKILL and SIGSTOP (no handler can run), and the rarer ones (SIGABRT from a V8 out-of-
 * memory abort, SIGPWR, SIGSYS, real-time signals): those may leave a temporary file beside its
 * target, never a changed target.
 */
export const endingSignals = ["SIGINT", "SIGTERM", "SIGHUP", "SIGQUIT", "SIGUSR2", "SIGALRM", "SIGVTALRM", "SIGXCPU"] as const;
