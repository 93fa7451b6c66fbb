/**
 * Command line for batch use and outside checks:
 *   npm run -s analysis -- COMMAND < input.json
 * reads one JSON object on stdin and prints one JSON object on stdout.
 * Exit codes: 0 for a result (including {"ok":false,"reason":…} for a fit that cannot be done),
 * 2 for malformed input (including inputs so large that a result would not be a finite number)
 * or an unknown command.
 *
 * Each command lives in analysis/cli/<command>.ts and exports `run(input: unknown): unknown`
 * and `help: string`. A thrown `InputError` (analysis/units/reading-input.ts) means malformed input.
 * Every number of every result is checked here, once, to be finite (JSON would print null).
 * The process ends by itself once stdout is flushed (`process.exitCode`, never `process.exit`,
 * which would cut a long result written to a pipe).
 */
import { readFileSync } from 'node:fs';
import { nonFiniteResultMessage } from './cli/finite-result';

const COMMANDS = ['fit', 'volume', 'mix', 'coil', 'forecast', 'uncertainty', 'cost', 'collector', 'plan', 'compare'] as const;
type Command = (typeof COMMANDS)[number];

interface CommandModule {
  run(input: unknown): unknown | Promise<unknown>;
  help: string;
}

async function load(cmd: Command): Promise<CommandModule> {
  return (await import(`./cli/${cmd}.ts`)) as CommandModule;
}

async function main(argv: string[]): Promise<number> {
  const [cmd, ...rest] = argv;
  if (!cmd || cmd === '--help' || cmd === '-h') {
    const lines = ['usage: npm run -s analysis -- COMMAND [--help] < input.json', '', 'commands:'];
    for (const c of COMMANDS) {
      try {
        lines.push(`  ${c.padEnd(12)} ${(await load(c)).help.split('\n')[0]}`);
      } catch {
        /* command not built yet */
      }
    }
    console.log(lines.join('\n'));
    return cmd ? 0 : 2;
  }
  if (!(COMMANDS as readonly string[]).includes(cmd)) {
    console.error(`unknown command "${cmd}"; expected one of ${COMMANDS.join(', ')}`);
    return 2;
  }
  const mod = await load(cmd as Command);
  if (rest.includes('--help') || rest.includes('-h')) {
    console.log(mod.help);
    return 0;
  }
  let input: unknown;
  try {
    input = JSON.parse(readFileSync(0, 'utf8'));
  } catch (e) {
    console.error(`input is not valid JSON: ${(e as Error).message}`);
    return 2;
  }
  try {
    const result = await mod.run(input);
    const bad = nonFiniteResultMessage(result, input);
    if (bad) {
      console.error(`malformed input: ${bad}`);
      return 2;
    }
    process.stdout.write(`${JSON.stringify(result)}\n`);
    return 0;
  } catch (e) {
    if ((e as Error).name === 'InputError' || e instanceof TypeError || e instanceof RangeError) {
      console.error(`malformed input: ${(e as Error).message}`);
      return 2;
    }
    throw e;
  }
}

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
