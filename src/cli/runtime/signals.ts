/**
 * The signals that end a run (main.ts): temporary files are removed and the status is 128 + the
 * signal's number; a launcher with a child (hugePages.ts) passes them on. Every signal whose default
 * action ends the process is here but SIGUSR1 (Node's inspector), SIGPROF (profilers), SIGPIPE and
 * SIGXFSZ (Node ignores them: the write fails instead), and SIGKILL and SIGSTOP (no handler can run;
 * a SIGKILL leaves the temporary file).
 */
export const endingSignals = ["SIGINT", "SIGTERM", "SIGHUP", "SIGQUIT", "SIGUSR2", "SIGALRM", "SIGVTALRM", "SIGXCPU"] as const;
