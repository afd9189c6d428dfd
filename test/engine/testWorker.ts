/** The tests' Node worker entry: the shipped job table plus testJobs.ts. */
import "./testJobs";
import { serveWorkerThread } from "../../src/engine/node";

serveWorkerThread();
