/**
 * The command index (src/cli/commands/index.ts) loads one command's module per run; `--help` lists the others from
 * the names, usage terms and summaries kept there. These must be what the modules themselves register.
 */
import { Command, Help } from 'commander';
import { describe, expect, test } from 'vitest';
import { commandIndex, selectedCommand } from '../../src/cli/commands/index.js';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';

describe('lazy command index', () => {
  test('each entry states the usage term and summary its module registers, in help order', async () => {
    const program = new Command('dispole');
    for (const entry of commandIndex) (await entry.load())(program, { io: memoryIO(), exitCode: 0 });
    const help = new Help();
    expect(program.commands.map((c) => c.name())).toEqual(commandIndex.map((e) => e.name));
    program.commands.forEach((c, i) => {
      expect(commandIndex[i].term).toBe(help.subcommandTerm(c));
      expect(commandIndex[i].summary).toBe(c.summary());
    });
  });

  test('the top-level help lists every command with its real help line', async () => {
    const io = memoryIO();
    expect(await runCli(['--help'], io)).toBe(0);
    for (const entry of commandIndex) expect(io.out).toContain(entry.term);
    expect(io.out).toContain('pair [options] <A> <B>            coefficients C6, C8, C10 and dispersion');
  });

  test('the command that runs is found from its name or from "help NAME"; anything else selects none', () => {
    expect(selectedCommand(['pair', 'Quelon', 'Virid'])?.name).toBe('pair');
    expect(selectedCommand(['help', 'table'])?.name).toBe('table');
    expect(selectedCommand(['--help'])).toBeUndefined();
    expect(selectedCommand(['paire'])).toBeUndefined();
  });

  test('an unknown command is still refused with exit 2, and a command\'s own help comes from its module', async () => {
    const bad = memoryIO();
    expect(await runCli(['paire', 'Quelon', 'Virid'], bad)).toBe(2);
    expect(bad.err).toMatch(/unknown command 'paire'/);
    const own = memoryIO();
    expect(await runCli(['help', 'pair'], own)).toBe(0);
    expect(own.out).toContain('--routes <list>');
  });
});
