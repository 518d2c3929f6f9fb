/*
 * Upper bounds for counters that can only be so large. A main engine running every hour
 * of 45 years reaches 394 200 h; ships are scrapped well before (common practice: 25–30
 * years), so 400 000 h is more than any real counter shows and refuses a slipped digit.
 */
export const MAX_RUNNING_HOURS = 400_000;
