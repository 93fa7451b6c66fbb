import 'server-only';
import { config, configProblems } from './config';

/** A production server whose configuration is unsafe does not start: one clear line per problem, then exit 1. */
export function refuseUnsafeStart(): void {
  const problems = configProblems(config);
  if (!problems.length) return;
  for (const p of problems) console.error(`emberline: refusing to start: ${p}`);
  process.exit(1);
}
