import { createElement, Fragment } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { DEVICE_MARKS, REVIEW_MARKS } from "@/components/state-mark";
import { DEVICE_STATES, REVIEW_STATES } from "@/lib/domain";
import config from "@/tailwind.config";
import en from "@/messages/en.json";
import es from "@/messages/es.json";
import fr from "@/messages/fr.json";

const drawing = (icon: unknown) => renderToStaticMarkup(createElement(Fragment, null, icon as never));
const marks = [
  ...REVIEW_STATES.map((s) => ({ name: `review ${s}`, look: REVIEW_MARKS[s] })),
  ...DEVICE_STATES.map((s) => ({ name: `device ${s}`, look: DEVICE_MARKS[s] })),
];

describe("state marks", () => {
  it("give every review state and every device state an icon of its own", () => {
    const icons = marks.map((m) => drawing(m.look.icon));
    for (const icon of icons) expect(icon).toMatch(/<(path|circle|rect)/);
    expect(new Set(icons).size).toBe(marks.length);
  });

  it("colour them from the palette of tailwind.config.ts", () => {
    const palette = Object.keys(config.theme?.extend?.colors ?? {});
    for (const { name, look } of marks) {
      const colours = look.cls.split(" ").map((c) => /^(?:border|bg|text)-([a-z]+)/.exec(c)?.[1]);
      for (const c of colours) expect(c === "white" || palette.includes(c!), `${name}: ${look.cls}`).toBe(true);
    }
  });

  it("have one word per state in every language, never the same word for a review and a device state", () => {
    for (const m of [en, es, fr]) {
      const review = REVIEW_STATES.map((s) => m.StateMark.review[s]);
      const device = DEVICE_STATES.map((s) => m.StateMark.device[s]);
      for (const w of [...review, ...device]) expect(w.trim()).not.toBe("");
      expect(new Set([...review, ...device].map((w) => w.toLowerCase())).size).toBe(review.length + device.length);
    }
  });
});
