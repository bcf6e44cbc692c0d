/**
 * Largest load-test file accepted, in bytes (50 MiB). Ten minutes at 1 kHz with four channels is
 * about 25 MB, so this leaves room for more channels without letting one upload fill the server's
 * memory; the app refuses bigger files before reading them.
 */
export const MAX_LOADTEST_BYTES = 50 * 1024 * 1024;

/** Fewest samples that make a run. */
export const MIN_SAMPLES = 2;
