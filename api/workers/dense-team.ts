/**
 * A `DenseTeam` (core/eigen/dense/team.ts) of worker threads: the dense eigensolver's heavy steps
 * (the Householder reduction's products, the back-transformation, the back-substitution) run in
 * parts on the calling thread and on `helpers` more threads, over SharedArrayBuffer arrays.
 *
 * Used by the evaluation workers (`evaluate.worker.ts`, one team each) and by `npm run bench`.
 * The solve is synchronous, so the caller waits with Atomics, not with promises:
 *
 * - one control block (Int32Array) shared with every helper: a generation counter the caller
 *   bumps for each step, the step's task and part count, a counter parts are claimed from, the
 *   ids of its arrays, and one acknowledgement per helper;
 * - the step's integers in a shared Int32Array (read back as small integers, which V8 keeps in
 *   integer form: as doubles they would slow every index computation of the task);
 * - each helper's MessagePort carries the arrays (`shared`) and which ones to drop, read
 *   synchronously with `receiveMessageOnPort` when a step starts, and the helper's error back.
 *
 * A solve's arrays are kept for the next solve of the same size (up to RETAIN_BYTES): new
 * SharedArrayBuffers cost page faults, and a helper thread, which allocates little, would
 * otherwise hold the old ones until its own garbage collection.
 *
 * Parts are claimed first come first served; which thread runs a part does not change its
 * arithmetic, so the result is the same bit for bit as without a team.
 */
import {
  MessageChannel,
  type MessagePort,
  receiveMessageOnPort,
  type Worker,
} from 'node:worker_threads';
// the engine's entry for helper threads (not core/index): a helper need not load the sheet engine
import { DENSE_TASKS, type DenseTask, type DenseTeam } from '../../core/threads';
import { engineThread } from './engine-thread';

/** Control block slots (Int32Array indices). */
export const CONTROL = {
  generation: 0,
  task: 1,
  parts: 2,
  next: 3,
  error: 4,
  arrays: 5,
  scalars: 6,
  stop: 7,
  /** Parts the helpers have run, all steps together (for tests and the benchmark). */
  helperParts: 40,
  /** First of MAX_ARRAYS array ids. */
  arrayIds: 8,
  /** First of MAX_HELPERS acknowledgements (the last generation each helper finished). */
  acks: 24,
  length: 41,
} as const;
export const MAX_ARRAYS = 16;
export const MAX_HELPERS = 16;
export const MAX_SCALARS = 64;

/** Task names in a fixed order; the control block holds the index. */
export const TASK_NAMES = Object.keys(DENSE_TASKS).sort();

/** What a helper gets in `workerData`. */
export interface HelperData {
  control: SharedArrayBuffer;
  scalars: SharedArrayBuffer;
  port: MessagePort;
  index: number;
}

/** Messages to a helper. */
export type HelperMessage =
  { type: 'array'; id: number; buffer: SharedArrayBuffer } | { type: 'drop'; ids: number[] };

export interface ThreadTeam extends DenseTeam {
  /** Parts the helper threads have run so far. */
  helperParts(): number;
  /** Stops the helper threads. */
  close(): Promise<void>;
}

/**
 * Bytes of free buffers a team keeps between solves for the next one (a solve at n = 1000 uses
 * about 42 MB); beyond it they are given back.
 */
const RETAIN_BYTES = 96 * 1024 * 1024;

/** How long the caller spins before it sleeps on a helper's acknowledgement, ms. */
const SPIN_MS = 1;
/** A step a helper has not finished after this long is taken for a dead helper, ms. */
const HELPER_TIMEOUT_MS = 120_000;

/**
 * Starts `helpers` worker threads (0 gives a team that runs everything on the caller) and
 * resolves when they have loaded the engine.
 * @throws Error when a helper fails to start.
 * @example const team = await createDenseTeam(1); solveModes(K, M, { team }); await team.close();
 */
export async function createDenseTeam(helpers: number): Promise<ThreadTeam> {
  const count = Math.max(0, Math.min(MAX_HELPERS, Math.floor(helpers)));
  const controlBuffer = new SharedArrayBuffer(CONTROL.length * 4);
  const scalarBuffer = new SharedArrayBuffer(MAX_SCALARS * 4);
  const control = new Int32Array(controlBuffer);
  const scalarSlots = new Int32Array(scalarBuffer);
  const workers: Worker[] = [];
  const ports: MessagePort[] = [];
  try {
    await Promise.all(
      Array.from({ length: count }, async (_, index) => {
        const { port1, port2 } = new MessageChannel();
        const data: HelperData = {
          control: controlBuffer,
          scalars: scalarBuffer,
          port: port2,
          index,
        };
        const worker = engineThread('dense-helper', { workerData: data, transferList: [port2] });
        workers.push(worker);
        ports.push(port1);
        await new Promise<void>((resolve, reject) => {
          port1.once('message', () => resolve());
          worker.once('error', reject);
          worker.once('exit', (code) => reject(new Error(`dense helper exited (${code})`)));
        });
        worker.removeAllListeners('error');
        worker.removeAllListeners('exit');
        // an idle helper must not keep the process alive
        worker.unref();
        port1.unref();
      }),
    );
  } catch (err) {
    await Promise.all(workers.map((w) => w.terminate()));
    throw err;
  }
  // helper h is workers[h], ports[h] and acknowledgement slot h
  // every buffer the helpers hold, by id; those in use in this solve (by view) and those free
  const buffers = new Map<number, SharedArrayBuffer>();
  const ids = new Map<Float64Array, number>();
  const free = new Map<number, SharedArrayBuffer>();
  let nextId = 1;
  let generation = 0;

  const post = (message: HelperMessage): void => {
    for (const port of ports) port.postMessage(message);
  };

  const waitForAck = (helper: number): void => {
    const slot = CONTROL.acks + helper;
    const t0 = performance.now();
    while (Atomics.load(control, slot) !== generation) {
      if (performance.now() - t0 < SPIN_MS) continue;
      Atomics.wait(control, slot, Atomics.load(control, slot), 100);
      if (performance.now() - t0 > HELPER_TIMEOUT_MS) {
        throw new Error(`dense helper ${helper} did not finish a step in ${HELPER_TIMEOUT_MS} ms`);
      }
    }
  };

  /** Starts a step: every helper reads its messages, then claims parts of task `taskIndex`. */
  const publish = (taskIndex: number, parts: number): void => {
    control[CONTROL.task] = taskIndex;
    control[CONTROL.parts] = parts;
    Atomics.store(control, CONTROL.error, 0);
    Atomics.store(control, CONTROL.next, 0);
    generation++;
    Atomics.store(control, CONTROL.generation, generation);
    Atomics.notify(control, CONTROL.generation);
  };

  const team: ThreadTeam = {
    size: count + 1,
    shared(length: number): Float64Array {
      if (count === 0) return new Float64Array(new SharedArrayBuffer(length * 8));
      // a buffer of an earlier solve of the same size, if one is free: no new pages to fault in
      // and nothing new for the helpers to hold
      for (const [id, buffer] of free) {
        if (buffer.byteLength !== length * 8) continue;
        free.delete(id);
        const array = new Float64Array(buffer);
        array.fill(0);
        ids.set(array, id);
        return array;
      }
      const buffer = new SharedArrayBuffer(length * 8);
      const array = new Float64Array(buffer);
      const id = nextId++;
      buffers.set(id, buffer);
      ids.set(array, id);
      post({ type: 'array', id, buffer });
      return array;
    },
    run(
      name: string,
      task: DenseTask,
      parts: number,
      arrays: readonly Float64Array[],
      scalars: readonly number[],
    ): void {
      const taskIndex = TASK_NAMES.indexOf(name);
      const arrayIds = arrays.map((a) => ids.get(a));
      if (
        count === 0 ||
        parts <= 1 ||
        taskIndex < 0 ||
        DENSE_TASKS[name] !== task ||
        arrays.length > MAX_ARRAYS ||
        scalars.length > MAX_SCALARS ||
        !scalars.every((x) => (x | 0) === x) ||
        arrayIds.some((id) => id === undefined)
      ) {
        for (let part = 0; part < parts; part++) task(part, arrays, scalars);
        return;
      }
      control[CONTROL.arrays] = arrays.length;
      control[CONTROL.scalars] = scalars.length;
      arrayIds.forEach((id, k) => (control[CONTROL.arrayIds + k] = id as number));
      scalars.forEach((x, k) => (scalarSlots[k] = x));
      publish(taskIndex, parts);
      let failure: unknown = null;
      try {
        for (let part = Atomics.add(control, CONTROL.next, 1); part < parts;) {
          task(part, arrays, scalars);
          part = Atomics.add(control, CONTROL.next, 1);
        }
      } catch (err) {
        failure = err;
      }
      for (let h = 0; h < count; h++) waitForAck(h);
      if (failure) throw failure;
      if (Atomics.load(control, CONTROL.error) !== 0) {
        const reasons = ports
          .map((port) => receiveMessageOnPort(port)?.message as unknown)
          .filter((m) => typeof m === 'string');
        throw new Error(`a dense helper failed in '${name}': ${reasons.join('; ')}`);
      }
    },
    release(): void {
      if (count === 0 || ids.size === 0) return;
      for (const id of ids.values()) free.set(id, buffers.get(id) as SharedArrayBuffer);
      ids.clear();
      // keep the free buffers up to RETAIN_BYTES, the smallest first; the helpers drop the rest
      let kept = 0;
      const dropped: number[] = [];
      for (const [id, buffer] of [...free].sort((a, b) => a[1].byteLength - b[1].byteLength)) {
        if (kept + buffer.byteLength <= RETAIN_BYTES) kept += buffer.byteLength;
        else {
          dropped.push(id);
          free.delete(id);
          buffers.delete(id);
        }
      }
      if (dropped.length === 0) return;
      post({ type: 'drop', ids: dropped });
      // a step without a task: the helpers drop them now, so their memory is returned before
      // the next solve
      publish(-1, 0);
      for (let h = 0; h < count; h++) waitForAck(h);
    },
    helperParts: () => Atomics.load(control, CONTROL.helperParts),
    async close(): Promise<void> {
      Atomics.store(control, CONTROL.stop, 1);
      generation++;
      Atomics.store(control, CONTROL.generation, generation);
      Atomics.notify(control, CONTROL.generation);
      await Promise.all(workers.map((w) => w.terminate()));
      for (const port of ports) port.close();
    },
  };
  return team;
}
