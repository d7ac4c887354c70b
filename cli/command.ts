/**
 * The `phasewright` command: subcommands `solve` (one netlist: summary, JSON or CSV — solver/cli.ts)
 * and `check` (many designs, exit code for CI — cli/check.ts), plus `help` and `--version`.
 */
import { run as solveOne } from "@/solver/cli";
import { check, EXIT, type Io } from "./check";

export const HELP = `phasewright — solve Phasewright netlists (.pwn) from the command line

  phasewright solve FILE [--json | --csv]
      Solve one netlist and print its summary (measures, checks, studies), the JSON result, or the
      traces as CSV. Exit 0 solved, 2 netlist errors, 1 anything else.

  phasewright check PATTERN… [options]
      Solve every netlist the patterns name ('designs/**/*.pwn'; quote it so the shell leaves it),
      in parallel. One line per design and per failed check.
      --report junit FILE      write a JUnit XML test report (repeatable; also --report json FILE)
      --jobs N                 designs solved at once (default: the machine's cores)
      --against RUN            compare the one design with a saved run: its id (with PHASEWRIGHT_URL)
                               or its URL; PHASEWRIGHT_TOKEN is an API token from Settings
      --tolerance NAME=LIMIT   how far a measure may move from the run: f0=0.5% (relative),
                               pm=2deg or f0=10Hz (absolute), *=1% (every other measure);
                               a trace: H=0.5dB or H=3deg. Without one, rounding only.
      Exit 0 every check passes and every measure is within its limit, 1 a check fails or a
      measure moved too far, 2 netlist errors, 3 the command could not run (arguments, files,
      baseline not reachable).

  phasewright help | --version
`;

export async function runCommand(argv: string[], io: Io): Promise<number> {
  const [sub, ...rest] = argv;
  switch (sub) {
    case "solve":
      return solveOne(rest, io.out, io.err, io.cwd);
    case "check":
      return check(rest, io);
    case "help":
    case "--help":
    case "-h":
      io.out(HELP);
      return EXIT.pass;
    case "--version":
    case "-v":
      io.out(`phasewright ${io.version}\n`);
      return EXIT.pass;
    case undefined:
      io.err(HELP);
      return EXIT.usage;
    default:
      io.err(`phasewright: unknown command ${sub} — use solve or check\n\n${HELP}`);
      return EXIT.usage;
  }
}
