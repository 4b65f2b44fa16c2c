// Keeps a child process running for `npm start`: when it dies (a crash, an out-of-memory kill)
// it is logged and started again after a pause that doubles with each quick death (1 s … 30 s)
// and resets once a run has lasted a minute. `stop()` ends it for good.
import { log, stopChild } from "./services.mjs";

export function supervise(name, spawnOnce, { minUptimeMs = 60_000, maxDelayMs = 30_000 } = {}) {
  let child = null;
  let stopped = false;
  let quickDeaths = 0;
  let timer = null;

  const launch = (first) => {
    child = first ?? spawnOnce();
    const startedAt = Date.now();
    child.once("exit", (code, signal) => {
      // Ctrl-C reaches the whole process group at once; give our own SIGINT handler the first word.
      setTimeout(() => {
        if (stopped) return;
        const ran = Date.now() - startedAt;
        quickDeaths = ran >= minUptimeMs ? 0 : quickDeaths + 1;
        const delay = Math.min(maxDelayMs, 1000 * 2 ** Math.max(0, quickDeaths - 1));
        log(`${name} stopped (${signal ? `signal ${signal}` : `exit code ${code}`}) after ${(ran / 1000).toFixed(1)} s; starting it again in ${delay / 1000} s`);
        timer = setTimeout(() => {
          timer = null;
          if (!stopped) launch();
        }, delay);
      }, 100);
    });
  };

  return {
    /** Take over an already running child (the first start waits for health elsewhere). */
    adopt(first) {
      launch(first);
    },
    get child() {
      return child;
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      if (child) await stopChild(child);
    },
  };
}
