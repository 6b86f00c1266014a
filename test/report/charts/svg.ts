/**
 * Reading the charts' SVG in tests: a small element tree from fast-xml-parser, lookups by the class
 * names the specs give their marks (Vega writes `class="mark-<type> role-mark <name>"` on each
 * mark's group), and the x axis read back from its tick labels, so pixel positions can be checked
 * against data values without knowing the chart's layout constants.
 */

import { XMLParser, XMLValidator } from "fast-xml-parser";
import { expect } from "vitest";

export interface Element {
  readonly tag: string;
  readonly attrs: Readonly<Record<string, string>>;
  readonly children: readonly Element[];
  /** The concatenated text content of this element and its descendants. */
  readonly text: string;
}

type Ordered = Record<string, unknown> & { ":@"?: Record<string, string> };

function toElement(node: Ordered): Element | null {
  const tag = Object.keys(node).find((k) => k !== ":@");
  if (tag === undefined || tag === "#text") return null;
  const raw = node[tag] as Ordered[];
  const children = raw.map(toElement).filter((e): e is Element => e !== null);
  const ownText = raw.filter((c) => "#text" in c).map((c) => String(c["#text"]));
  const attrs = Object.fromEntries(Object.entries(node[":@"] ?? {}).map(([k, v]) => [k.replace(/^@_/, ""), String(v)]));
  return { tag, attrs, children, text: [...ownText, ...children.map((c) => c.text)].join("") };
}

/** Asserts that `svg` is well-formed XML with an `<svg>` root and returns the root element. */
export function parseSvg(svg: string): Element {
  const valid = XMLValidator.validate(svg);
  expect(valid, typeof valid === "object" ? JSON.stringify(valid.err) : "").toBe(true);
  const parser = new XMLParser({
    ignoreAttributes: false,
    attributeNamePrefix: "@_",
    preserveOrder: true,
    parseAttributeValue: false,
    parseTagValue: false,
    trimValues: false,
  });
  const nodes = parser.parse(svg) as Ordered[];
  const roots = nodes.map(toElement).filter((e): e is Element => e !== null);
  expect(roots.map((r) => r.tag)).toEqual(["svg"]);
  return roots[0]!;
}

/** Every element in document order. */
export function descendants(e: Element): Element[] {
  return e.children.flatMap((c) => [c, ...descendants(c)]);
}

const classes = (e: Element): string[] => (e.attrs.class ?? "").split(/\s+/);

/** The group Vega writes for the mark named `name` (exactly one expected). */
export function markGroup(root: Element, name: string): Element {
  const groups = descendants(root).filter((e) => e.tag === "g" && classes(e).includes("role-mark") && classes(e).includes(name));
  expect(groups, `mark ${name}`).toHaveLength(1);
  return groups[0]!;
}

/** The one group whose class list includes `cls` (e.g. a Vega role such as "role-title-subtitle"). */
export function groupWithClass(root: Element, cls: string): Element {
  const groups = descendants(root).filter((e) => e.tag === "g" && classes(e).includes(cls));
  expect(groups, `group .${cls}`).toHaveLength(1);
  return groups[0]!;
}

/** The item elements (paths, lines, texts) of the mark named `name`. */
export function markItems(root: Element, name: string): Element[] {
  return markGroup(root, name).children.filter((e) => e.tag !== "g");
}

/** The items of every group of the mark named `name` (a mark inside a facet has one group per facet). */
export function facetItems(root: Element, name: string): Element[] {
  return descendants(root)
    .filter((e) => e.tag === "g" && classes(e).includes("role-mark") && classes(e).includes(name))
    .flatMap((g) => g.children.filter((e) => e.tag !== "g"));
}

/** Whether a mark named `name` exists. */
export function hasMark(root: Element, name: string): boolean {
  return descendants(root).some((e) => e.tag === "g" && classes(e).includes("role-mark") && classes(e).includes(name));
}

/** The (x, y) of a `translate(x,y)` transform. */
export function translation(e: Element): [number, number] {
  const m = /translate\(([-\d.e+]+),\s*([-\d.e+]+)\)/.exec(e.attrs.transform ?? "");
  expect(m, `transform of <${e.tag}>`).not.toBeNull();
  return [Number(m![1]), Number(m![2])];
}

/** Every text shown in the SVG (text elements, the lines of a multi-line text joined by a space). */
export function texts(root: Element): string[] {
  return descendants(root)
    .filter((e) => e.tag === "text")
    .map((e) => (e.children.some((c) => c.tag === "tspan") ? e.children.map((c) => c.text).join(" ") : e.text));
}

/**
 * The x axis as a function from data value to pixel (in the plot's coordinates), fitted through its
 * tick labels: each label's text is a value, its translate() x the pixel it is drawn at.
 */
export function xAxisScale(root: Element): (value: number) => number {
  return axisScale(root, "X");
}

/** The y axis as a function from data value to pixel, like xAxisScale (from the tick labels' y). */
export function yAxisScale(root: Element): (value: number) => number {
  return axisScale(root, "Y");
}

function axisScale(root: Element, which: "X" | "Y"): (value: number) => number {
  const axis = descendants(root).find(
    (e) => e.tag === "g" && classes(e).includes("role-axis") && (e.attrs["aria-label"] ?? "").startsWith(`${which}-axis`),
  );
  expect(axis, `${which} axis`).toBeDefined();
  const labelGroup = descendants(axis!).find((e) => e.tag === "g" && classes(e).includes("role-axis-label"));
  const labels = labelGroup!.children.filter((e) => e.tag === "text");
  // The y axis's labels sit a few pixels off their ticks (Vega's baseline shift): its tick lines give the pixels.
  const tickGroup = descendants(axis!).find((e) => e.tag === "g" && classes(e).includes("role-axis-tick"));
  const tickLines = tickGroup?.children.filter((e) => e.tag === "line") ?? [];
  const positions = which === "X" ? labels.map((e) => translation(e)[0]) : tickLines.map((e) => translation(e)[1]);
  expect(positions).toHaveLength(labels.length);
  const ticks = labels.map((e, i) => ({ value: Number(e.text.replace("\u2212", "-")), x: positions[i]! }));
  expect(ticks.length).toBeGreaterThanOrEqual(3);
  const n = ticks.length;
  const mv = ticks.reduce((a, t) => a + t.value, 0) / n;
  const mx = ticks.reduce((a, t) => a + t.x, 0) / n;
  const slope = ticks.reduce((a, t) => a + (t.value - mv) * (t.x - mx), 0) / ticks.reduce((a, t) => a + (t.value - mv) ** 2, 0);
  // (Vega shifts the whole axis group by half a pixel for crisp lines; that is not part of the scale.)
  return (value: number) => mx + slope * (value - mv);
}

/** The x extent of a rect drawn by Vega as `M x,y h w v h h -w Z`. */
export function rectExtent(path: Element): [number, number] {
  const m = /^M([-\d.e+]+),([-\d.e+]+)h([-\d.e+]+)/.exec(path.attrs.d ?? "");
  expect(m, `rect path ${path.attrs.d}`).not.toBeNull();
  const x = Number(m![1]);
  return [x, x + Number(m![3])];
}

/**
 * The area of a symbol drawn by Vega as a path around its centre: a circle ("M r,0 A r,r ...") or a
 * polygon of M / L / l / h / v segments (square, diamond, triangles), by the shoelace formula.
 */
export function symbolArea(d: string): number {
  const arc = /A([\d.]+),/.exec(d);
  if (arc !== null) return Math.PI * Number(arc[1]) ** 2;
  const points: [number, number][] = [];
  let x = 0;
  let y = 0;
  for (const [, command, args] of d.matchAll(/([MLmlhvHVZz])([^MLmlhvHVZz]*)/g)) {
    const n = (args ?? "")
      .split(/[\s,]+/)
      .filter((t) => t !== "")
      .map(Number);
    if (command === "M" || command === "L") [x, y] = [n[0]!, n[1]!];
    else if (command === "m" || command === "l") [x, y] = [x + n[0]!, y + n[1]!];
    else if (command === "h") x += n[0]!;
    else if (command === "v") y += n[0]!;
    else if (command === "H") x = n[0]!;
    else if (command === "V") y = n[0]!;
    else continue;
    points.push([x, y]);
  }
  let twice = 0;
  for (const [i, [x1, y1]] of points.entries()) {
    const [x2, y2] = points[(i + 1) % points.length]!;
    twice += x1 * y2 - x2 * y1;
  }
  return Math.abs(twice) / 2;
}
