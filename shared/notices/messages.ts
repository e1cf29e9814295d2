import { formatDistance, formatLocalDate } from '../runs/display.ts';
import type { Unit } from '../users/schemas.ts';

/**
 * The words of each notice e-mail (issue 16), pure so they can be checked without sending anything.
 * The server adds the frame, the links' host and the unsubscribe footer.
 */
export interface NoticeMessage {
  subject: string;
  /** The heading inside the message. */
  title: string;
  paragraphs: string[];
  /** One item per run or note, in order. */
  items: Array<{ text: string; href?: string }>;
  link?: { href: string; label: string };
}

/** At most this many runs are listed one by one in an upload notice; the rest are counted. */
export const UPLOAD_NOTICE_LISTED_MAX = 20;

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

export interface UploadedRun {
  name: string;
  local_date: string;
  distance_m: number;
  href: string;
}

/** One upload batch of one runner, for a coach who reads distances in `unit`. */
export function uploadNotice(runnerName: string, runs: readonly UploadedRun[], unit: Unit, weekHref: string): NoticeMessage {
  const what = runs.length === 1 ? 'a run' : `${runs.length} runs`;
  const listed = runs.slice(0, UPLOAD_NOTICE_LISTED_MAX).map((r) => ({
    text: `${formatLocalDate(r.local_date)} · ${r.name} · ${formatDistance(r.distance_m, unit, 2)} ${unit}`,
    href: r.href,
  }));
  const rest = runs.length - listed.length;
  return {
    subject: `${runnerName} uploaded ${what}`,
    title: `${runnerName} uploaded ${what}`,
    paragraphs:
      rest > 0 ? [`The first ${listed.length} are listed; ${count(rest, 'more run', 'more runs')} came in the same upload.`] : [],
    items: listed,
    link: { href: weekHref, label: 'Open the week review' },
  };
}

export interface NewNote {
  author_name: string;
  /** "the run “Long run” of 5 Dec 2026" or "the week of 30 Nov 2026". */
  about: string;
  /** For a coach: whose run or week it is. */
  runner_name: string;
  excerpt: string;
  href: string;
}

/** Every note written to the reader since the last such e-mail. */
export function notesNotice(notes: readonly NewNote[], readerIsRunner: boolean): NoticeMessage {
  const authors = [...new Set(notes.map((n) => n.author_name))];
  const subject =
    notes.length === 1
      ? `A new note from ${notes[0]!.author_name}`
      : `${notes.length} new notes from ${authors.length === 1 ? authors[0] : `${authors.length} people`}`;
  return {
    subject,
    title: notes.length === 1 ? 'A new note' : `${notes.length} new notes`,
    paragraphs: [],
    items: notes.map((n) => ({
      text: `${n.author_name} on ${readerIsRunner ? 'your' : `${n.runner_name}’s`} ${n.about}: “${n.excerpt}”`,
      href: n.href,
    })),
  };
}

export type PainReport =
  | { source: 'checkin'; soreness: number; run_name: string; local_date: string }
  | { source: 'note'; concern: 'pain' | 'illness'; about: string; excerpt: string };

/**
 * A runner reported pain, illness or soreness 4–5. Worded with care: it repeats what the runner
 * reported, diagnoses nothing, and leaves the assessment to a physician or physiotherapist.
 */
export function painAlert(runnerName: string, report: PainReport, href: string): NoticeMessage {
  const said =
    report.source === 'checkin'
      ? `${runnerName} reported soreness ${report.soreness} of 5 in the check-in after “${report.run_name}” on ${formatLocalDate(report.local_date)}.`
      : `${runnerName} marked a note on their ${report.about} as about ${report.concern}: “${report.excerpt}”`;
  return {
    subject:
      report.source === 'checkin'
        ? `${runnerName} reported soreness ${report.soreness} of 5`
        : `${runnerName} wrote a note about ${report.concern}`,
    title: report.source === 'checkin' ? 'High soreness reported' : `A note about ${report.concern}`,
    paragraphs: [
      said,
      'This is what the runner reported, not an assessment: Pacewright cannot tell what causes it or how serious it is.',
      report.source === 'note' && report.concern === 'illness'
        ? 'If they feel unwell, a physician is the one to say when training can resume.'
        : 'Pain that is sharp, keeps getting worse, lasts more than a few days or changes how they run is for a physician or physiotherapist to assess before the next hard session.',
      'You know the runner: a word with them comes before any change to the plan.',
    ],
    items: [],
    link: { href, label: report.source === 'checkin' ? 'Open the run' : 'Open the note' },
  };
}

/** A runner left one of the coach's squads. */
export function squadLeaveNotice(runnerName: string, squadName: string, leftOn: string, squadHref: string): NoticeMessage {
  return {
    subject: `${runnerName} left ${squadName}`,
    title: `${runnerName} left ${squadName}`,
    paragraphs: [
      `${runnerName} left the squad “${squadName}” on ${formatLocalDate(leftOn)}.`,
      'Their runs, plans and weeks are no longer shown to you, and nothing about them will appear in your digest.',
    ],
    items: [],
    link: { href: squadHref, label: 'Open the squad' },
  };
}
