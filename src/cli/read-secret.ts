/**
 * Reads a line at the terminal without showing it (a password): the terminal goes into raw
 * mode, typed characters are collected, Backspace removes one, Enter ends, Ctrl-C or
 * Ctrl-D gives up.
 */
export function readSecretFromTerminal(prompt: string): Promise<string> {
  const input = process.stdin;
  const output = process.stderr;
  return new Promise((resolve, reject) => {
    let text = '';
    output.write(prompt);
    input.setRawMode(true);
    input.setEncoding('utf8');
    input.resume();
    const finish = (err?: Error) => {
      input.setRawMode(false);
      input.pause();
      input.off('data', onData);
      output.write('\n');
      if (err) reject(err);
      else resolve(text);
    };
    const onData = (chunk: string) => {
      for (const ch of chunk) {
        if (ch === '\r' || ch === '\n') return finish();
        if (ch === '\u0003' || ch === '\u0004') return finish(new Error('cancelled at the prompt'));
        if (ch === '\u007f' || ch === '\b') text = [...text].slice(0, -1).join('');
        else if (ch >= ' ') text += ch;
      }
    };
    input.on('data', onData);
  });
}
