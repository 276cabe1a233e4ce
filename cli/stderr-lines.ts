/**
 * Whole lines on stderr. A progress bar redraws one line with '\r' and leaves it open (no '\n')
 * until its work ends; a work that ends early (a multistart that stops, profiles skipped) leaves it
 * open for good. Anything printed next on the same terminal, such as the 'wrote:' list of output
 * files, was then glued to the end of the bar. Every stderr writer of the commands goes through
 * here: a partial line is remembered, and the next whole line first closes it.
 */

/** The part of a stream the writers need (process.stderr, or a test's stand-in). */
export interface LineStream {
  write(text: string): unknown;
  isTTY?: boolean;
}

const openLine = new WeakMap<LineStream, boolean>();

/** Write text that leaves the line open (a progress bar drawn with '\r'). */
export function writePartial(stream: LineStream, text: string): void {
  stream.write(text);
  openLine.set(stream, !text.endsWith('\n'));
}

/** Close a line left open by writePartial, if any. */
export function endOpenLine(stream: LineStream): void {
  if (openLine.get(stream)) stream.write('\n');
  openLine.set(stream, false);
}

/** Write whole lines: a line left open is closed first, and the text ends with a newline. */
export function writeLines(stream: LineStream, text: string): void {
  endOpenLine(stream);
  stream.write(text.endsWith('\n') ? text : `${text}\n`);
}

/** The list of files a command wrote, on lines of their own. */
export function writeWrittenList(stream: LineStream, paths: readonly string[]): void {
  if (paths.length) writeLines(stream, `wrote:\n${paths.map((w) => `  ${w}`).join('\n')}`);
}
