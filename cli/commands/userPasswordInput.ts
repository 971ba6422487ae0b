import { createInterface } from 'node:readline';
import { UsageError } from '../usageError';

/**
 * The password for `holdfast user create`: typed at a terminal (twice, not
 * echoed), or read as the first line of standard input when that is a pipe
 * (`printf '%s\n' "$PASSWORD" | holdfast user create …`). Never from the
 * command line, where `ps` and the shell history would keep it, and not from
 * an environment variable, which child processes inherit and /proc shows
 * (common practice, no source).
 */
export async function readNewPassword(input: NodeJS.ReadStream = process.stdin, output: NodeJS.WriteStream = process.stderr): Promise<string> {
  if (!input.isTTY) return firstLine(input);
  const first = await promptHidden(input, output, 'Password (at least 15 characters): ');
  const second = await promptHidden(input, output, 'Repeat the password: ');
  if (first !== second) throw new UsageError('the two passwords differ; nothing was created');
  return first;
}

async function firstLine(input: NodeJS.ReadableStream): Promise<string> {
  const lines = createInterface({ input, crlfDelay: Infinity });
  for await (const line of lines) {
    lines.close();
    return line;
  }
  throw new UsageError('no password on standard input; pipe it in, or run the command at a terminal to type it');
}

/** Prompt on `output` and read one line from the terminal without echoing it. */
function promptHidden(input: NodeJS.ReadStream, output: NodeJS.WriteStream, question: string): Promise<string> {
  return new Promise((resolve, reject) => {
    output.write(question);
    input.setRawMode(true);
    input.resume();
    input.setEncoding('utf8');
    let typed = '';
    const finish = (error?: Error) => {
      input.setRawMode(false);
      input.pause();
      input.removeListener('data', onData);
      output.write('\n');
      if (error) reject(error);
      else resolve(typed);
    };
    const onData = (chunk: string) => {
      for (const ch of chunk) {
        if (ch === '\r' || ch === '\n') return finish();
        if (ch === '\u0003') return finish(new UsageError('cancelled; nothing was created')); // Ctrl-C
        if (ch === '\u007f' || ch === '\b') typed = [...typed].slice(0, -1).join('');
        else typed += ch;
      }
    };
    input.on('data', onData);
  });
}
