/**
 * A helper thread of a `createDenseTeam` team (./dense-team.ts): waits on the shared control
 * block for a step, runs the parts it can claim with the engine's own task functions
 * (`DENSE_TASKS`), acknowledges the step and waits again. Its arrays arrive on its MessagePort.
 * Once started it first runs a small solve of its own (`warmUpDenseSteps`), so that its first
 * real steps run optimized code.
 */
import v8 from 'node:v8';
import vm from 'node:vm';
import { receiveMessageOnPort, workerData } from 'node:worker_threads';
import { DENSE_TASKS, warmUpDenseSteps } from '../../core/threads';
import { CONTROL, type HelperData, type HelperMessage, TASK_NAMES } from './dense-team';

/** How long a helper spins for the next step before it sleeps, ms: steps of the reduction come
 * every few hundred microseconds, and a sleeping thread takes tens of them to wake. */
const SPIN_MS = 1;

const { control: controlBuffer, scalars: scalarBuffer, port, index } = workerData as HelperData;
const control = new Int32Array(controlBuffer);
const scalarSlots = new Int32Array(scalarBuffer);
const arrays = new Map<number, Float64Array>();
const ackSlot = CONTROL.acks + index;

/**
 * A full collection, to hand dropped buffers back at once: this thread allocates so little that
 * its own collector would hold them for a long time. Null when the runtime refuses the flag.
 */
const collect: (() => void) | null = (() => {
  try {
    v8.setFlagsFromString('--expose-gc');
    const gc: unknown = vm.runInNewContext('gc');
    return typeof gc === 'function' ? (gc as () => void) : null;
  } catch {
    return null;
  }
})();
let dropped = false;

function drainMessages(): void {
  for (let m = receiveMessageOnPort(port); m; m = receiveMessageOnPort(port)) {
    const message = m.message as HelperMessage;
    if (message.type === 'array') arrays.set(message.id, new Float64Array(message.buffer));
    else {
      for (const id of message.ids) arrays.delete(id);
      dropped = true;
    }
  }
}

function runStep(): void {
  if ((control[CONTROL.task] as number) < 0) return; // only the messages
  const name = TASK_NAMES[control[CONTROL.task] as number] as string;
  const task = DENSE_TASKS[name];
  const parts = control[CONTROL.parts] as number;
  const views: Float64Array[] = [];
  for (let k = 0; k < (control[CONTROL.arrays] as number); k++) {
    const view = arrays.get(control[CONTROL.arrayIds + k] as number);
    if (!view) throw new Error(`array ${control[CONTROL.arrayIds + k]} of '${name}' never arrived`);
    views.push(view);
  }
  const scalars = Array.from(scalarSlots.subarray(0, control[CONTROL.scalars] as number));
  if (!task) throw new Error(`unknown dense task '${name}'`);
  for (let part = Atomics.add(control, CONTROL.next, 1); part < parts;) {
    task(part, views, scalars);
    Atomics.add(control, CONTROL.helperParts, 1);
    part = Atomics.add(control, CONTROL.next, 1);
  }
}

let seen = Atomics.load(control, CONTROL.generation);
port.postMessage('ready');
// Steps published meanwhile are run by the caller, which claims every part no thread has.
try {
  warmUpDenseSteps();
} catch {
  // only a warm-up: the steps themselves report their errors
}
for (;;) {
  let generation = Atomics.load(control, CONTROL.generation);
  if (generation === seen) {
    const t0 = performance.now();
    while ((generation = Atomics.load(control, CONTROL.generation)) === seen) {
      if (performance.now() - t0 > SPIN_MS) {
        Atomics.wait(control, CONTROL.generation, seen);
        generation = Atomics.load(control, CONTROL.generation);
        break;
      }
    }
  }
  if (Atomics.load(control, CONTROL.stop) !== 0) break;
  if (generation === seen) continue;
  seen = generation;
  drainMessages();
  try {
    runStep();
  } catch (err) {
    port.postMessage(err instanceof Error ? (err.stack ?? err.message) : String(err));
    Atomics.store(control, CONTROL.error, 1);
  }
  Atomics.store(control, ackSlot, generation);
  Atomics.notify(control, ackSlot);
  if (dropped) {
    dropped = false;
    collect?.();
  }
}
port.close();
