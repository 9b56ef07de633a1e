/**
 * A fixed team of threads (the main thread plus worker threads) that run the tasks of src/math/team-tasks.ts
 * together on one shared WebAssembly memory, synchronously: `run` returns when all units of the task are done.
 *
 * Workers are started from source text (`new Worker(code, { eval: true })`), so the same code works from the
 * compiled dist/ and from the TypeScript sources under the test runner. They wait on a shared control block
 * (Atomics.wait/notify, after a short spin) and take work units from a shared counter; the calling thread takes
 * units too and never waits for a worker that has not joined the run (on a loaded machine a sleeping worker costs
 * nothing). Workers are unref'd and told to quit by `close()`, so they never keep the process alive.
 */
import type { MessagePort, Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { workerThreadsModule } from '../lazy-modules.js';
import { Workspace, instantiateKernels, kernelModule, type Kernels, type WasmMemory } from './simd-kernels.js';
import { TEAM_TASKS, type TeamContext, type TeamTaskName } from './team-tasks.js';

// control block: Int32 slots, then Float64 task arguments
/** (sequence << 4) | command: RUN wakes the workers, ATTACH and QUIT are done by every worker. */
const COMMAND = 0;
/** Units of the current run: (generation << 20) | counter; the counter is CLOSED once the run is over. */
const UNITS = 1;
/** Workers inside a run (the caller waits for them, not for workers that did not wake in time). */
const BUSY = 2;
/** Workers yet to finish an ATTACH. */
const PENDING = 3;
const TASK = 4, FAILED = 5;
const RUN = 0, ATTACH = 1, QUIT = 2;
const CLOSED = 0xfffff;
const ARGS_OFFSET = 64, ARGS_MAX = 128;
/**
 * Busy-wait iterations before sleeping in Atomics.wait (tens of µs: enough to catch the next step of the
 * tridiagonalisation on an idle machine; longer spins cost more than they save when other jobs share the cores).
 */
const SPIN = 2000;
/** Matrices of at least this order are worth the threads' start-up (about 50 ms) and synchronisation. */
const PARALLEL_MIN_ORDER = 500;
const MAX_THREADS = 8;
/** Longest wait for the workers to bind a new memory (they start in well under a second, even on a loaded machine). */
const ATTACH_TIMEOUT_MS = 60_000;

const TASK_NAMES = Object.keys(TEAM_TASKS) as TeamTaskName[];

/**
 * The next unit of run `generation`, or CLOSED when that run is over or exhausted (compare-and-swap on the units
 * word, so a late thread can never take a unit of a later run). Self-contained: the workers get its source.
 */
function takeUnit(ctl: Int32Array, generation: number): number {
  for (;;) {
    const word = Atomics.load(ctl, 1);
    const counter = word & 0xfffff;
    if (word >>> 20 !== generation || counter === 0xfffff) return 0xfffff;
    if (Atomics.compareExchange(ctl, 1, word, word + 1) === word) return counter;
  }
}

/**
 * Source of a worker: the task functions, then the command loop. A worker joins a run only if the run is still
 * open when it wakes (it counts itself in BUSY first, so the caller cannot start the next run under it); the
 * tasks write nothing before their first unit, so a worker that finds the run closed does nothing.
 */
function workerSource(): string {
  const tasks = TASK_NAMES.map((name) => TEAM_TASKS[name].toString()).join(',\n');
  return `'use strict';
const { workerData, receiveMessageOnPort } = require('node:worker_threads');
const { control, port, module, member } = workerData;
const ctl = new Int32Array(control);
const args = new Float64Array(control, ${ARGS_OFFSET}, ${ARGS_MAX});
const tasks = [${tasks}];
const takeUnit = ${takeUnit.toString()};
let ctx = null, seen = 0, generation = -1;
for (;;) {
  let command;
  for (let s = 0; (command = Atomics.load(ctl, ${COMMAND})) === seen; s++) if (s > ${SPIN}) Atomics.wait(ctl, ${COMMAND}, seen);
  seen = command;
  if ((command & 15) === ${QUIT}) break;
  if ((command & 15) === ${ATTACH}) {
    try {
      let m;
      while (!(m = receiveMessageOnPort(port))) Atomics.wait(ctl, ${FAILED}, 0, 1);
      const memory = m.message.memory;
      ctx = memory && { kernels: new WebAssembly.Instance(module, { env: { memory } }).exports,
        f64: new Float64Array(memory.buffer), member, next: () => takeUnit(ctl, generation), done() {} };
    } catch (e) {
      port.postMessage(String((e && e.stack) || e));
      Atomics.store(ctl, ${FAILED}, 1);
    }
    if (Atomics.sub(ctl, ${PENDING}, 1) === 1) Atomics.notify(ctl, ${PENDING});
    continue;
  }
  Atomics.add(ctl, ${BUSY}, 1);
  const word = Atomics.load(ctl, ${UNITS});
  generation = word >>> 20;
  if (ctx && (word & ${CLOSED}) !== ${CLOSED}) {
    try {
      tasks[ctl[${TASK}]](ctx, args);
    } catch (e) {
      port.postMessage(String((e && e.stack) || e));
      Atomics.store(ctl, ${FAILED}, 1);
    }
  }
  if (Atomics.sub(ctl, ${BUSY}, 1) === 1) Atomics.notify(ctl, ${BUSY});
}
port.close();
`;
}

/** How many threads to use for a dense problem of order n: all cores (up to 8) from order 500, else one. */
export function teamSizeFor(n: number): number {
  return n >= PARALLEL_MIN_ORDER ? Math.max(1, Math.min(MAX_THREADS, availableParallelism())) : 1;
}

export class ThreadTeam {
  private readonly control = new SharedArrayBuffer(ARGS_OFFSET + 8 * ARGS_MAX);
  private readonly ctl = new Int32Array(this.control);
  private readonly args = new Float64Array(this.control, ARGS_OFFSET, ARGS_MAX);
  private readonly workers: { worker: Worker; port: MessagePort }[] = [];
  private ctx: TeamContext | null = null;
  private memory: WasmMemory | null = null;
  private onUnit: () => void = () => {};
  private sequence = 0;
  private generation = 0;
  private closed = false;
  /**
   * Milliseconds the calling thread spent, at the end of the last run, waiting for workers to finish the units
   * they had taken (large when a worker was descheduled mid-unit on a busy machine).
   */
  lastWaitMs = 0;

  /** A team of `size` threads in all (size − 1 workers; size 1 runs everything on the calling thread). */
  constructor(readonly size: number) {
    if (!(Number.isInteger(size) && size >= 1)) throw new RangeError(`thread team size must be a positive integer, got ${size}`);
    this.ctl[UNITS] = CLOSED;
    if (size === 1) return;
    const code = workerSource();
    new Function('require', code); // a syntax error would kill the workers silently: fail here instead
    const module = kernelModule();
    const { MessageChannel, Worker } = workerThreadsModule();
    for (let member = 1; member < size; member++) {
      const { port1, port2 } = new MessageChannel();
      const worker = new Worker(code, { eval: true, workerData: { control: this.control, port: port2, module, member }, transferList: [port2] });
      worker.unref();
      port1.unref();
      this.workers.push({ worker, port: port1 });
    }
  }

  /** Bind the team to a workspace (every thread instantiates the kernels on its memory); null releases it. */
  attach(workspace: Workspace | null): void {
    this.ensureOpen();
    if (workspace && this.ctx && this.memory === workspace.memory) return; // same memory: kernels already bound
    this.memory = workspace?.memory ?? null;
    this.ctx = workspace && {
      kernels: instantiateKernels(workspace.memory),
      f64: workspace.f64,
      member: 0,
      next: () => takeUnit(this.ctl, this.generation),
      done: () => this.onUnit(),
    };
    if (this.workers.length === 0) return;
    for (const { port } of this.workers) port.postMessage({ memory: workspace?.memory ?? null });
    Atomics.store(this.ctl, FAILED, 0);
    Atomics.store(this.ctl, PENDING, this.workers.length);
    this.command(ATTACH);
    // a worker that never starts would leave us waiting here (the caller's event loop is blocked): give up after a while
    if (!this.waitUntilZero(PENDING, ATTACH_TIMEOUT_MS)) throw new Error(`worker threads did not start within ${ATTACH_TIMEOUT_MS / 1000} s`);
    this.rethrowWorkerError();
  }

  /**
   * Run a task with the given arguments (numbers; pointers in bytes) on every thread that is free to take part;
   * returns when all its units are done. `onUnit` is called after each of the calling thread's units. `local`
   * runs it on the calling thread only (pieces too small to share).
   */
  run(task: TeamTaskName, args: readonly number[], options: { onUnit?: () => void; local?: boolean } = {}): void {
    this.ensureOpen();
    if (!this.ctx) throw new Error('thread team has no workspace attached');
    if (args.length > ARGS_MAX) throw new RangeError(`at most ${ARGS_MAX} task arguments`);
    this.args.set(args);
    this.args.fill(0, args.length); // arguments a task treats as optional read 0, not a previous run's values
    this.ctl[TASK] = TASK_NAMES.indexOf(task);
    Atomics.store(this.ctl, FAILED, 0);
    this.generation = (this.generation + 1) & 0x7ff;
    Atomics.store(this.ctl, UNITS, this.generation << 20); // open the run
    const shared = this.workers.length > 0 && !options.local;
    if (shared) this.command(RUN);
    this.onUnit = options.onUnit ?? (() => {});
    let error: unknown;
    try {
      TEAM_TASKS[task](this.ctx, this.args);
    } catch (e) {
      error = e;
    }
    Atomics.store(this.ctl, UNITS, (this.generation << 20) | CLOSED); // no more units for late workers
    const waitFrom = performance.now();
    this.waitUntilZero(BUSY); // also after a local run: a worker late for an earlier run may have joined this one
    this.lastWaitMs = performance.now() - waitFrom;
    this.onUnit = () => {};
    if (error) throw error;
    this.rethrowWorkerError();
  }

  /** The calling thread's kernels on the attached memory (for small pieces of work outside a task). */
  get kernels(): Kernels {
    if (!this.ctx) throw new Error('thread team has no workspace attached');
    return this.ctx.kernels;
  }

  /** Units taken so far in the current run (for progress). */
  unitsTaken(): number {
    return Atomics.load(this.ctl, UNITS) & CLOSED;
  }

  /** Tell the workers to quit (idempotent). */
  close(): void {
    if (this.closed) return;
    this.closed = true;
    this.ctx = null;
    this.memory = null;
    if (this.workers.length) this.command(QUIT);
    for (const { port } of this.workers) port.close();
  }

  private command(command: number): void {
    this.sequence = (this.sequence + 1) & 0x7ffffff;
    Atomics.store(this.ctl, COMMAND, (this.sequence << 4) | command);
    Atomics.notify(this.ctl, COMMAND);
  }

  /** Spin, then sleep, until the slot is 0; false if that took longer than `timeoutMs`. */
  private waitUntilZero(slot: number, timeoutMs = Infinity): boolean {
    const deadline = Date.now() + timeoutMs;
    for (let s = 0; ; s++) {
      const value = Atomics.load(this.ctl, slot);
      if (value === 0) return true;
      if (s > SPIN) {
        if (Date.now() > deadline) return false;
        Atomics.wait(this.ctl, slot, value, Math.min(1000, timeoutMs));
      }
    }
  }

  private rethrowWorkerError(): void {
    if (!Atomics.load(this.ctl, FAILED)) return;
    const messages: string[] = [];
    const { receiveMessageOnPort } = workerThreadsModule();
    for (const { port } of this.workers) for (let m; (m = receiveMessageOnPort(port)); ) messages.push(String(m.message));
    throw new Error(`worker thread failed: ${messages.join('\n')}`);
  }

  private ensureOpen(): void {
    if (this.closed) throw new Error('thread team is closed');
  }
}

/** Run `fn` with a team of `size` threads, closing it afterwards. */
export function withThreadTeam<T>(size: number, fn: (team: ThreadTeam) => T): T {
  const team = new ThreadTeam(size);
  try {
    return fn(team);
  } finally {
    team.close();
  }
}

/**
 * Run `fn` on `team` when given, else on a temporary team sized for order n (closed afterwards); either way the
 * team is released from its workspace at the end, so the memory can be collected.
 */
export function withTeamFor<T>(n: number, team: ThreadTeam | undefined, fn: (team: ThreadTeam) => T): T {
  if (!team) return withThreadTeam(teamSizeFor(n), fn);
  try {
    return fn(team);
  } finally {
    team.attach(null);
  }
}

/** Order up to which one single-thread team and its memory are kept between calls (many small problems). */
const KEEP_ORDER = 300;
let kept: { team: ThreadTeam; memory?: WasmMemory; busy: boolean } | undefined;

/**
 * Run `fn` on a workspace with the arrays `sizes(teamSize)` and a team attached to it: `team` when given; else,
 * for order n ≤ 300, a kept single-thread team and memory reused from call to call (no set-up per call; `kept`
 * is then true and the workspace's arrays hold the previous call's data and will be overwritten by the next
 * call: copy out what must outlive `fn`); else a fresh workspace and a temporary team sized for n.
 */
export function withWorkspace<T>(
  n: number,
  sizes: (teamSize: number) => Record<string, number>,
  fn: (team: ThreadTeam, ws: Workspace, kept: boolean) => T,
  team?: ThreadTeam,
): T {
  if (!team && n <= KEEP_ORDER) {
    kept ??= { team: new ThreadTeam(1), busy: false };
    if (!kept.busy) {
      kept.busy = true;
      try {
        const ws = new Workspace(sizes(1), kept.memory);
        kept.memory = ws.memory;
        kept.team.attach(ws);
        return fn(kept.team, ws, true);
      } finally {
        kept.busy = false;
      }
    }
  }
  return withTeamFor(n, team, (t) => {
    const ws = new Workspace(sizes(t.size));
    t.attach(ws);
    return fn(t, ws, false);
  });
}
