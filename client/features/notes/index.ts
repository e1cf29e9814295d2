// The public face of the notes feature: the only file other client features import.

export { useMarkReadOnOpen } from './components/mark-read-on-open.ts';
export { UnreadDot } from './components/unread-dot.tsx';
