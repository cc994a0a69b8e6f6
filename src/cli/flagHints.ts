/**
 * The engine names arguments in its own words ("give a bandwidth", "the
 * donut", "the sensitivity multiple"); on the command line the option that
 * sets each is added in brackets, once, so the user sees what to type.
 * Example: "… choose a smaller donut, or give a bandwidth" becomes
 * "… choose a smaller donut (--donut), or give a bandwidth (--bandwidth NUM)".
 */
const HINTS: Array<[RegExp, string]> = [
  [/\bgive a bandwidth( instead| wide enough[^;,.)]*)?/, ' (--bandwidth NUM)'],
  [/\bchoose a smaller donut/, ' (--donut)'],
  [/\bthe sensitivity multiple [^ ]+/, ' (--sensitivity)'],
  [/\buse a trim near the default 0\.1/, ' (--trim)'],
];

export function withFlags(message: string): string {
  if (message.includes('(--')) return message;
  let out = message;
  for (const [pattern, flag] of HINTS) out = out.replace(pattern, (m) => m + flag);
  return out;
}
