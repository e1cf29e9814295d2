import { hostname } from 'node:os';

/** This process as `host:pid`: recorded on work it claims, so an operator can tell which process did what. */
export const PROCESS_LABEL = `${hostname()}:${process.pid}`;
