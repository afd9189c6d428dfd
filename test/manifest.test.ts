/**
 * manifest.xml against what webpack writes (webpack.config.js outputNames) and against the
 * add-in only manifest rules the shared runtime depends on (Office add-in documentation:
 * "Configure your Office Add-in to use a shared runtime", and the element references for
 * Runtime, ExtensionPoint CustomFunctions, Resources and Requirements).
 */
import * as fs from "fs";
import * as path from "path";
import { XMLParser } from "fast-xml-parser";

interface OutputNames {
  devUrl: string;
  taskpaneHtml: string;
  functionsScript: string;
  functionsMetadata: string;
  assetsDir: string;
}

const { outputNames } = require("../webpack.config.js") as { outputNames: OutputNames };

const ROOT = path.join(__dirname, "..");
type XmlNode = { [key: string]: unknown };

// Namespace prefixes removed (bt:Url → Url, xsi:type → @_type); every value kept as text.
const parser = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: "@_",
  removeNSPrefix: true,
  parseTagValue: false,
  parseAttributeValue: false,
});
const doc = parser.parse(fs.readFileSync(path.join(ROOT, "manifest.xml"), "utf8")) as XmlNode;
const app = doc.OfficeApp as XmlNode;
const overrides = app.VersionOverrides as XmlNode;

function list(v: unknown): XmlNode[] {
  if (v === undefined || v === null) return [];
  return (Array.isArray(v) ? v : [v]) as XmlNode[];
}

/** Every element named `name` anywhere under `node`, in document order. */
function all(node: unknown, name: string): XmlNode[] {
  const out: XmlNode[] = [];
  const visit = (n: unknown): void => {
    if (Array.isArray(n)) return n.forEach(visit);
    if (n === null || typeof n !== "object") return;
    for (const [k, v] of Object.entries(n as XmlNode)) {
      if (k.startsWith("@_")) continue;
      if (k === name) out.push(...list(v));
      visit(v);
    }
  };
  visit(node);
  return out;
}

function one(node: unknown, name: string): XmlNode {
  const found = all(node, name);
  expect(found).toHaveLength(1);
  return found[0];
}

function attr(node: XmlNode, name: string): string {
  const v = node[`@_${name}`];
  if (typeof v !== "string") throw new Error(`attribute ${name} missing on ${JSON.stringify(node)}`);
  return v;
}

function text(node: unknown): string {
  if (typeof node === "string") return node.trim();
  const t = (node as XmlNode)["#text"];
  if (typeof t !== "string") throw new Error(`no text in ${JSON.stringify(node)}`);
  return t.trim();
}

const resources = overrides.Resources as XmlNode;
function defined(group: string, element: string): Map<string, string> {
  const m = new Map<string, string>();
  for (const e of list((resources[group] as XmlNode | undefined)?.[element])) {
    m.set(attr(e, "id"), attr(e, "DefaultValue"));
  }
  return m;
}
const urls = defined("Urls", "Url");
const images = defined("Images", "Image");
const shortStrings = defined("ShortStrings", "String");
const longStrings = defined("LongStrings", "String");

function urlOf(resid: string): string {
  const u = urls.get(resid);
  if (u === undefined) throw new Error(`resid ${resid} is not a bt:Url`);
  return u;
}

const workbookHost = one(overrides, "Host");
const customFunctions = all(overrides, "ExtensionPoint").find((e) => attr(e, "type") === "CustomFunctions");
if (!customFunctions) throw new Error("no CustomFunctions extension point");
const showTaskpane = all(overrides, "Action").find((a) => attr(a, "type") === "ShowTaskpane");
if (!showTaskpane) throw new Error("no ShowTaskpane action");

const sharedUrl = outputNames.devUrl + outputNames.taskpaneHtml;

describe("manifest.xml", () => {
  it("is a task pane add-in for Excel with a fixed GUID, named Fairlead", () => {
    expect(attr(app, "type")).toBe("TaskPaneApp");
    expect(text(app.Id)).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[1-5][0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/i);
    expect(text(app.ProviderName)).toBe("Fairlead");
    expect(attr(app.DisplayName as XmlNode, "DefaultValue")).toBe("Fairlead");
    expect(list((app.Hosts as XmlNode).Host).map((h) => attr(h, "Name"))).toEqual(["Workbook"]);
    expect(attr(overrides, "type")).toBe("VersionOverridesV1_0");
    expect(attr(workbookHost, "type")).toBe("Workbook");
    expect(text(app.Permissions)).toBe("ReadWriteDocument");
  });

  it("puts the functions in the FAIRLEAD namespace", () => {
    const ns = attr(one(customFunctions, "Namespace"), "resid");
    expect(shortStrings.get(ns)).toBe("FAIRLEAD");
  });

  it("runs runtime, task pane and functions page from the one page webpack writes", () => {
    const runtimes = all(workbookHost, "Runtime");
    expect(runtimes).toHaveLength(1);
    expect(attr(runtimes[0], "lifetime")).toBe("long");
    const runtimeResid = attr(runtimes[0], "resid");
    const paneResid = attr(one(showTaskpane, "SourceLocation"), "resid");
    const pageResid = attr(one(customFunctions.Page, "SourceLocation"), "resid");
    // The documentation asks for the same resid, not only the same URL, in all three places.
    expect(paneResid).toBe(runtimeResid);
    expect(pageResid).toBe(runtimeResid);
    expect(urlOf(runtimeResid)).toBe(sharedUrl);
    expect(attr(one(workbookHost, "FunctionFile"), "resid")).toBe(runtimeResid);
    expect(attr(one(app.DefaultSettings, "SourceLocation"), "DefaultValue")).toBe(sharedUrl);
    // One pane: a shared runtime supports a single task pane, named by its TaskpaneId.
    expect(text(one(showTaskpane, "TaskpaneId"))).not.toBe("");
  });

  it("points Script and Metadata at the functions bundle and functions.json", () => {
    const script = attr(one(customFunctions.Script, "SourceLocation"), "resid");
    const metadata = attr(one(customFunctions.Metadata, "SourceLocation"), "resid");
    expect(urlOf(script)).toBe(outputNames.devUrl + outputNames.functionsScript);
    expect(urlOf(metadata)).toBe(outputNames.devUrl + outputNames.functionsMetadata);
  });

  it("opens the pane from a button on the Home tab", () => {
    const tab = one(workbookHost, "OfficeTab");
    expect(attr(tab, "id")).toBe("TabHome");
    const group = one(tab, "Group");
    expect(shortStrings.get(attr(group.Label as XmlNode, "resid"))).toBe("Fairlead");
    const button = one(group, "Control");
    expect(attr(button, "type")).toBe("Button");
    expect(shortStrings.get(attr(button.Label as XmlNode, "resid"))).toBe("Open Fairlead");
    expect(all(button, "Action")[0]).toBe(showTaskpane);
  });

  it("defines every resid it uses, each at most 32 characters", () => {
    const definedIds = new Set([...urls.keys(), ...images.keys(), ...shortStrings.keys(), ...longStrings.keys()]);
    const used: string[] = [];
    const visit = (n: unknown): void => {
      if (Array.isArray(n)) return n.forEach(visit);
      if (n === null || typeof n !== "object") return;
      for (const [k, v] of Object.entries(n as XmlNode)) {
        if (k === "@_resid" && typeof v === "string") used.push(v);
        else visit(v);
      }
    };
    visit(overrides);
    expect(used.length).toBeGreaterThan(10);
    expect(used.filter((id) => !definedIds.has(id))).toEqual([]);
    expect([...definedIds, ...used].filter((id) => id.length > 32)).toEqual([]);
  });

  it("serves every URL from the dev server", () => {
    const everyUrl = [
      ...urls.values(),
      ...images.values(),
      attr(app.IconUrl as XmlNode, "DefaultValue"),
      attr(app.HighResolutionIconUrl as XmlNode, "DefaultValue"),
    ];
    for (const u of everyUrl) expect(u.startsWith(outputNames.devUrl)).toBe(true);
  });

  it("refers only to icons that exist in assets/, at the size it declares", () => {
    const pngSize = (file: string): number => {
      const b = fs.readFileSync(file);
      expect(b.subarray(1, 4).toString("ascii")).toBe("PNG");
      const w = b.readUInt32BE(16);
      expect(b.readUInt32BE(20)).toBe(w); // square
      return w;
    };
    const local = (url: string): string => {
      const prefix = `${outputNames.devUrl}${outputNames.assetsDir}/`;
      expect(url.startsWith(prefix)).toBe(true);
      const file = path.join(ROOT, "assets", url.slice(prefix.length));
      expect(fs.existsSync(file)).toBe(true);
      return file;
    };
    // Ribbon images: every <Image size="n" resid=…> names a PNG n pixels wide.
    const uses = all(workbookHost, "Image");
    expect(uses.length).toBeGreaterThan(0);
    for (const use of uses) {
      const url = images.get(attr(use, "resid"));
      if (url === undefined) throw new Error(`image ${attr(use, "resid")} not defined`);
      expect(pngSize(local(url))).toBe(Number(attr(use, "size")));
    }
    expect(pngSize(local(attr(app.IconUrl as XmlNode, "DefaultValue")))).toBe(32);
    expect(pngSize(local(attr(app.HighResolutionIconUrl as XmlNode, "DefaultValue")))).toBe(64);
  });

  it("declares the requirement sets it uses, in the base manifest and in VersionOverrides", () => {
    const setsOf = (req: unknown): Map<string, string> => {
      const sets = one(req, "Sets");
      const dflt = (sets["@_DefaultMinVersion"] as string | undefined) ?? "1.1";
      return new Map(all(sets, "Set").map((s) => [attr(s, "Name"), (s["@_MinVersion"] as string | undefined) ?? dflt]));
    };
    const version = (v: string | undefined): number => Number(v);
    for (const sets of [setsOf(app.Requirements), setsOf(overrides.Requirements)]) {
      expect(sets.get("SharedRuntime")).toBe("1.1");
      expect(version(sets.get("CustomFunctionsRuntime"))).toBeGreaterThanOrEqual(1.1);
      // The pane's change watch (Table.onChanged, Worksheet.onChanged), its chart series
      // (ChartSeries.setValues, series.add) and NamedItem.formula are ExcelApi 1.7.
      expect(version(sets.get("ExcelApi"))).toBeGreaterThanOrEqual(1.7);
    }
  });
});
