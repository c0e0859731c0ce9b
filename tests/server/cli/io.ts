import type { CommandIo } from '../../../server/cli/command';

/** A CommandIo that keeps what a command printed, for in-process command tests. */
export function captureIo(): CommandIo & { stdout: () => string; stderr: () => string } {
  const out: string[] = [];
  const err: string[] = [];
  return {
    out: (text) => void out.push(text),
    err: (text) => void err.push(text),
    errIsTTY: false,
    stdout: () => out.join(''),
    stderr: () => err.join(''),
  };
}
