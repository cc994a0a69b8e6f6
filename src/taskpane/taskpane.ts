/**
 * The task pane page (a placeholder until the guided check): it says whether
 * Office is ready. The worksheet functions run in this same page (shared
 * runtime), loaded by functions.js.
 */
declare const Office: { onReady(): Promise<{ host: unknown }> };

interface StatusLine {
  textContent: string | null;
}
const doc = (globalThis as unknown as { document?: { getElementById(id: string): StatusLine | null } }).document;

function say(text: string): void {
  const line = doc?.getElementById('cutline-status');
  if (line) line.textContent = text;
}

if (typeof Office !== 'undefined') {
  void Office.onReady().then((info) =>
    say(info.host ? 'Cutline is ready: type =CUTLINE. in a cell to see the functions.' : 'Open this page from Excel to use Cutline.'),
  );
} else say('office.js did not load.');
