/** Limits on what the editor will read from a file, checked before the file is read into memory. */

/** The largest file we open: a sheet of a few thousand parts is well under 1 MB of JSON; an SVG with plots a few MB. */
export const MAX_FILE_BYTES = 5 * 1024 * 1024;

const mb = (n: number) => (Math.round((n / 1024 / 1024) * 10) / 10).toString();

/** Why a file cannot be opened before reading it, or null. */
export function fileProblem(file: { name: string; size: number }): string | null {
  if (file.size === 0) return `${file.name} is empty`;
  if (file.size > MAX_FILE_BYTES) return `${file.name} is too large to be a sheet (${mb(file.size)} MB; a sheet file is at most ${mb(MAX_FILE_BYTES)} MB)`;
  return null;
}
