// The public face of the squad feature: the only file other client features import.

export { DownloadLink } from './components/week-nav.tsx';
