/**
 * Preloaded into the site build child (node --import): ends the build when the
 * `strobe site` process that started it is gone. A parent stopped by a signal
 * it can catch stops the child itself (commands/site.ts); one killed outright
 * (SIGKILL, an out-of-memory kill) cannot, and its child is re-parented, so the
 * child watches its parent id and, when it changes, removes the half-built
 * folder and exits. Plain JavaScript: the child runs without the TypeScript loader.
 */
import { rmSync } from 'node:fs';

const parent = Number(process.env.STROBE_BUILD_PARENT);
const folder = process.env.STROBE_BUILD_FOLDER;
if (Number.isInteger(parent) && parent > 0) {
  setInterval(() => {
    if (process.ppid === parent) return;
    if (folder) rmSync(folder, { recursive: true, force: true });
    process.exit(143);
  }, 250).unref();
}
