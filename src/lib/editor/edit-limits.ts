/** Limits every timeline edit shares (edge moves, splits, segment moves). */

/** Shortest segment the editor makes or leaves when moving an edge (a tenth of a second). */
export const MIN_SEGMENT_SECONDS = 0.1;
/** Two edges closer than this are one shared boundary and move together. */
export const SAME_TIME = 0.0005;
