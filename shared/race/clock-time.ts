const H_MM_SS = /^(\d{1,3}):([0-5]\d):([0-5]\d(?:\.\d+)?)$/;
const M_SS = /^(\d{1,4}):([0-5]\d(?:\.\d+)?)$/;

/**
 * Seconds from a clock time as people write race times: `h:mm:ss` ("1:25:00" → 5100) or `m:ss`
 * ("19:56" → 1196, "90:00" → 5400); seconds may carry decimals ("4:05.3"). Surrounding spaces are ignored.
 * Anything else (a bare number, "1:5", "1:60", empty) gives null.
 */
export function parseClockTime(text: string): number | null {
  const t = text.trim();
  const long = H_MM_SS.exec(t);
  if (long) return Number(long[1]) * 3600 + Number(long[2]) * 60 + Number(long[3]);
  const short = M_SS.exec(t);
  if (short) return Number(short[1]) * 60 + Number(short[2]);
  return null;
}
