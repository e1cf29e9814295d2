/** The marker on a note, run or day the other side wrote on and the reader has not opened. */
export function UnreadDot({ label = 'new' }: { label?: string }) {
  return (
    <span className="inline-flex items-center gap-1 text-xs font-semibold text-tartan" data-unread="true">
      <span aria-hidden="true" className="inline-block size-2 rounded-full bg-tartan" />
      {label}
    </span>
  );
}
