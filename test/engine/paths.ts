/** Where test/engine/globalSetup.ts puts the compiled worker scripts the Node transport runs. */
import * as path from "path";

export const REPO_ROOT = path.resolve(__dirname, "..", "..");
export const ENGINE_TEST_BUILD = path.join(REPO_ROOT, "build", "engine-test");
/** Entry files compiled (with everything they import) by the global setup. */
export const WORKER_ENTRIES = [
  path.join(REPO_ROOT, "src", "engine", "nodeWorker.ts"),
  path.join(REPO_ROOT, "test", "engine", "testWorker.ts"),
  // The batch runner's command line, which the batch tests start as a process of its own.
  path.join(REPO_ROOT, "src", "batch", "cli.ts"),
];
/** The production entry, compiled: serves the shipped job table. */
export const PRODUCTION_WORKER = path.join(ENGINE_TEST_BUILD, "src", "engine", "nodeWorker.js");
/** The test entry: the shipped table plus the test-only kinds of testJobs.ts. */
export const TEST_WORKER = path.join(ENGINE_TEST_BUILD, "test", "engine", "testWorker.js");
/** The command-line runner, compiled: test/batch runs it as `node <BATCH_CLI> …`. */
export const BATCH_CLI = path.join(ENGINE_TEST_BUILD, "src", "batch", "cli.js");
