import { execFile } from 'node:child_process';
import { promisify } from 'node:util';

const run = promisify(execFile);

export interface OpsOutcome {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs `npm run ops -- …` the way operators do (node + tsx on the CLI entry), never throwing. */
export async function runOps(args: string[], env: NodeJS.ProcessEnv = process.env): Promise<OpsOutcome> {
  try {
    const { stdout, stderr } = await run('node', ['--import', 'tsx', 'server/cli/ops.ts', ...args], { env });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const e = err as OpsOutcome;
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}
