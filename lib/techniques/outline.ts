/** Fewer headings than this and a write-up is short enough to read without in-page contents. */
export const CONTENTS_MIN_HEADINGS = 3;
