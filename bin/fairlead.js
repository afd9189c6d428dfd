#!/usr/bin/env node
// The `fairlead` command: runs the compiled batch runner (npm run build:batch makes it).
const path = require("path");
const fs = require("fs");
const cli = path.join(__dirname, "..", "build", "batch", "src", "batch", "cli.js");
if (!fs.existsSync(cli)) {
  process.stderr.write("fairlead: the batch runner is not built yet; run `npm run build:batch` first.\n");
  process.exit(1);
}
require(cli)
  .main(process.argv.slice(2))
  .then((code) => {
    process.exitCode = code;
  });
