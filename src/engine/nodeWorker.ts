/** Entry script of a Node engine worker (compiled to nodeWorker.js; see node.ts). */
import { serveWorkerThread } from "./node";

serveWorkerThread();
