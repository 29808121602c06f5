/** Runs the strobe command in this process and collects what it prints. */
import { main } from '../../src/cli/main.ts';

export async function runStrobe(argv: string[], cwd = process.cwd()): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), cwd });
  return { code, stdout, stderr };
}
