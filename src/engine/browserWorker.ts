/** Entry script of a Web Worker engine worker: the pane's build bundles it and passes its URL to BrowserTransport. */
import { serveBrowserWorker } from "./browser";

serveBrowserWorker();
