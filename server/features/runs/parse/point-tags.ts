/**
 * Counting a document's track-point tags (`<trkpt`, `<Trackpoint`, any namespace prefix) while
 * it is read, instead of in a pass of its own before: the 200 000-point limit
 * (shared/runs/upload-limits.ts) is decided on exactly the count `countTrackPointTags` gives, and
 * a file over it is refused as soon as its count passes the limit, before the reader has kept
 * more points than the limit (a reader keeps at most one point per tag).
 *
 * The reader tells the counter how far it has read (`countTo`): every stretch saxes or the
 * element scanner reads is counted as `countTrackPointTags` counts it. A point read by a template
 * (point-template.ts) whose own bytes hold exactly its opening tag is added as one (`pointAt`)
 * without searching its bytes; only a value the template reader does not read as a plain number
 * or time is searched (`countIn`), because only there could the letters of a tag hide.
 */
import { MAX_TRACK_POINTS, tooManyPointsReason } from '../../../../shared/runs/upload-limits.ts';
import type { TrackFormat } from './detect.ts';
import { ImportRejection } from './import-rejection.ts';

/** The local name of a format's track point. */
export function pointTagName(format: TrackFormat): string {
  return format === 'gpx' ? 'trkpt' : 'Trackpoint';
}

/** Bytes that may follow a point's name in its opening tag: whitespace, `>` or `/`. */
function endsName(code: number | undefined): boolean {
  return code === 0x20 || code === 0x3e || code === 0x09 || code === 0x0a || code === 0x0d || code === 0x2f;
}

/**
 * Opening tags of `tag` (the bytes of a point's local name) that lie wholly in bytes[from, to),
 * judged on the whole document: `<trkpt ` or `<ns:trkpt>`, never `</trkpt>` or a longer name such
 * as `<trkpts`. Comments are counted too: an upper bound of the points a reader can collect.
 */
export function countPointTagsIn(bytes: Buffer, tag: Buffer, from: number, to: number): number {
  let count = 0;
  // ASCII bytes are the same characters in every encoding xmlBytesOf gives, and never part of another character.
  for (let at = bytes.indexOf(tag, from); at !== -1 && at + tag.length <= to; at = bytes.indexOf(tag, at + tag.length)) {
    const before = bytes[at - 1];
    const opens =
      before === 0x3c /* < */ || (before === 0x3a /* : */ && bytes.lastIndexOf(0x3c, at) > bytes.lastIndexOf(0x2f, at));
    if (opens && endsName(bytes[at + tag.length])) count++;
  }
  return count;
}

/** How far past the reader an arriving document is searched: a new view every 4 KB, at most 4 KB of zeros searched. */
const SEARCH_AHEAD_BYTES = 4096;

/** The byte every point name holds (`k`): a value without it holds no tag. */
const TAG_LETTER = 0x6b;

/** The point-tag count of one document, kept while it is read; see the top of this file. */
export class PointTagCounter {
  /** Tags counted so far, in bytes[0, countedTo). */
  total = 0;
  private countedTo = 0;
  readonly tag: Buffer;

  constructor(
    private readonly bytes: Buffer,
    format: TrackFormat,
    /**
     * The document is still arriving in `bytes` (parse/arriving.ts), zeros past what has arrived: searches
     * then stop a few KB past where the reader is, never running through the rest of its memory.
     */
    private readonly arriving = false,
  ) {
    this.tag = Buffer.from(pointTagName(format), 'latin1');
    if (!this.tag.includes(TAG_LETTER)) throw new Error('point-tags.ts: a point name without its letter');
  }

  /** The reader has read bytes[0, to) (never inside a tag): count what it has not been told of. */
  countTo(to: number): void {
    // Too short to hold a tag (the whitespace between two points): nothing to search.
    if (to - this.countedTo >= this.tag.length) this.add(countPointTagsIn(this.searched(to), this.tag, this.countedTo, to));
    if (to > this.countedTo) this.countedTo = to;
  }

  /**
   * A template read the point at bytes[start, end), whose literal bytes hold its own opening tag
   * and no other; the values that may hold more are given to `countIn` before the next call.
   */
  pointAt(start: number, end: number): void {
    this.countTo(start);
    this.add(1);
    this.countedTo = end;
  }

  /** A value at bytes[from, to) inside the point just given to `pointAt`: count any tag wholly in it. */
  countIn(from: number, to: number): void {
    for (let at = from; at < to; at++) {
      if (this.bytes[at] === TAG_LETTER) {
        this.add(countPointTagsIn(this.searched(to), this.tag, from, to));
        return;
      }
    }
  }

  /** What is searched for tags up to `to` (the count reads at most bytes[to]: any longer view counts the same). */
  private view: Buffer | null = null;
  private searched(to: number): Buffer {
    if (!this.arriving) return this.bytes;
    if (this.view === null || this.view.length < to + 1) {
      this.view = this.bytes.subarray(0, Math.min(this.bytes.length, to + 1 + SEARCH_AHEAD_BYTES));
    }
    return this.view;
  }

  private add(count: number): void {
    this.total += count;
    // Refused as soon as the count passes the limit: the reader never keeps more points than that.
    if (this.total > MAX_TRACK_POINTS) throw new ImportRejection('too-many-points', tooManyPointsReason(this.total)!);
  }
}
