/**
 * The layout of one entry of the inverted prefix lists, shared by the self-join and the join
 * against an index: entry e of a list of stride s sits at entries[s·e .. s·e + s). The join
 * against an index uses the first three fields (stride 3); the packed self-join adds where the
 * set starts in the packed data (stride 4) and, with the bitmap filter, its signature (stride
 * ENTRY).
 */
import { SIGNATURE_WORDS } from './bitmap';

/** Size of the set. */
export const SIZE = 0;
/** The set's number in processing (size) order. */
export const SET = 1;
/** Position of the list's id in the set. */
export const POSITION = 2;
/** Packed self-join only: where the set starts in the packed data. */
export const START = 3;
/** Packed self-join with the bitmap filter only: first word of the set's signature. */
export const SIGNATURE = 4;
/** Width of a packed self-join entry with the signature. */
export const ENTRY = 4 + SIGNATURE_WORDS;
