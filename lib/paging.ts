/**
 * Tables count their rows up to a cap: exact for any real shop or brand desk, and cheap for a
 * very large one, which reads "1,000+" instead of paying for a full count on every page.
 */
export const COUNT_CAP = 1000;
