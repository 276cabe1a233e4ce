/**
 * "wrote:" always starts a line of its own on stderr, after a progress bar that ended early as
 * well as after one that finished, and error lines too. The stream is a stand-in terminal
 * recording what the commands' own writers (cli/run.ts, cli/stderr-lines.ts) send it.
 */
import { describe, expect, it } from 'vitest';
import { progressReporter } from '../../cli/run';
import { writeLines, writeWrittenList } from '../../cli/stderr-lines';

function terminal() {
  const t = { isTTY: true, text: '', write: (s: string) => ((t.text += s), true) };
  return t;
}

/** The lines as a terminal shows them: '\r' returns to the start of the line and redraws it. */
const shownLines = (text: string) => text.split('\n').map((l) => l.slice(l.lastIndexOf('\r') + 1));

describe('wrote: on a line of its own', () => {
  it('after a progress bar that stopped before 100 %', () => {
    const t = terminal();
    const progress = progressReporter(false, 'multistart', t)!;
    progress(1, 4);
    progress(2, 4); // the work ends here: the bar is never completed
    writeWrittenList(t, ['reports/a-kinetics.json', 'reports/a-fit.html']);
    const lines = shownLines(t.text);
    expect(lines).toContain('wrote:');
    expect(lines.find((l) => l.includes('wrote:'))).toBe('wrote:');
    expect(lines).toContain('  reports/a-kinetics.json');
    expect(lines.some((l) => l.startsWith('multistart [') && l.endsWith('50%'))).toBe(true);
  });
  it('after a finished progress bar, without an empty line between', () => {
    const t = terminal();
    const progress = progressReporter(false, 'profile intervals', t)!;
    for (let i = 1; i <= 3; i++) progress(i, 3);
    writeWrittenList(t, ['x.md']);
    expect(t.text.endsWith('100%\nwrote:\n  x.md\n')).toBe(true);
  });
  it('error lines and other whole lines close an open bar too', () => {
    const t = terminal();
    progressReporter(false, 'fitting rival rate laws', t)!(1, 3);
    writeLines(t, 'error [E_FILE] cannot write');
    expect(shownLines(t.text)).toContain('error [E_FILE] cannot write');
  });
  it('nothing is written for an empty list, and no bar is drawn off a terminal', () => {
    const t = terminal();
    writeWrittenList(t, []);
    expect(t.text).toBe('');
    expect(progressReporter(false, 'x', { isTTY: false, write: () => true })).toBeUndefined();
    expect(progressReporter(true, 'x', t)).toBeUndefined();
  });
});
