// Browser tests open the real exported build: make sure it is current before any test runs.
import path from "node:path";
import { projectRoot } from "../../server/config";
import { buildWebIfChanged } from "../../server/web-build";

export default function setup() {
  buildWebIfChanged(path.join(projectRoot, "dist"), (line) => console.log(`[web build] ${line}`));
}
