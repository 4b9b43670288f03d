/** A timestamp in the user's locale ("5 Mar 2031, 14:02"); the ISO text when it does not parse. */
export function formatTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}
