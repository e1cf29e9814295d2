// The public face of the fees feature: the only file other client features import.

export { describeFee } from './components/fee-words.ts';
