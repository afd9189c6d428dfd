/**
 * Collections for office-addin-mock, which has none of its own: Office.js loads a collection's
 * members with load("items/name, items/values"), and reads them from `items` after a sync.
 * Two ways to build one, both keeping the mock's rule that nothing is readable before load and
 * sync: from child data built with the collection, or over mocks made beforehand.
 */
import { OfficeMockObject } from "office-addin-mock";

export type Data = Record<string, unknown>;
export type Mock = OfficeMockObject & Record<string, unknown>;

/** Splits a load argument into the collection's own properties and those of each item. */
function splitLoad(props: string): { own: string[]; item: string[] } {
  const own: string[] = ["items"];
  const item: string[] = [];
  for (const p of props.split(",").map((s) => s.trim())) {
    if (p.startsWith("items/")) item.push(p.slice("items/".length));
    else if (p !== "items") own.push(p);
  }
  return { own, item };
}

/** Data for a collection of `children`, stored under item0, item1, …; call wireItems after the mock is built. */
export function childCollection(children: Data[]): Data {
  const data: Data = {
    load(this: Mock, props: string) {
      const { own, item } = splitLoad(props);
      if (item.length > 0) children.forEach((_, i) => (this[`item${i}`] as OfficeMockObject).load(item.join(",")));
      OfficeMockObject.prototype.load.call(this, own.join(","));
      return this;
    },
  };
  children.forEach((c, i) => (data[`item${i}`] = c));
  return data;
}

/** After the mock is built: gives a childCollection its `items`, readable only after load and sync. */
export function wireItems(mock: Mock, count: number): void {
  const items = Array.from({ length: count }, (_, i) => mock[`item${i}`]);
  (mock as unknown as { setValue(name: string, value: unknown): void }).setValue("items", items);
}

/** A collection over mocks made beforehand; `onLoad` runs at each load (to count or to fail). */
export function mockCollection(items: OfficeMockObject[], extra: Data = {}, onLoad?: () => void): Data {
  return {
    items,
    ...extra,
    load(this: OfficeMockObject, what: string) {
      onLoad?.();
      OfficeMockObject.prototype.load.call(this, "items");
      const { item } = splitLoad(what);
      const props = [...item, ...what.split(",").map((p) => p.trim()).filter((p) => p !== "items" && !p.startsWith("items/"))].join(",");
      if (props) for (const it of items) it.load(props);
      return this;
    },
  };
}
