// TypeDoc plugin: resolve `{@link InvalidArgumentError}` (and the other error
// classes) in the comments of every layer to the classes documented on the
// package root.
//
// The error classes are exported from the root only (src/errors.ts has no
// subpath of its own), while the functions of `filterwright/tf`,
// `filterwright/math`, ... that throw them are documented in their own
// modules. TypeDoc resolves a plain `{@link Name}` by walking up from the
// comment's module, and TypeScript gives no symbol for a link inside
// `@throws {...}`, so without this a link from a layer to an error class does
// not resolve. Only links with no target of their own are set, and only to
// classes of the root module whose names no other module exports.
import { Converter, ReflectionKind } from "typedoc";

/** @param {import("typedoc").Application} app */
export function load(app) {
  app.converter.on(
    Converter.EVENT_RESOLVE_END,
    (context) => {
      const project = context.project;
      const modules = project.children ?? [];
      const root = modules.find((m) => m.name === "index");
      if (root === undefined) return;
      const elsewhere = new Set(modules.filter((m) => m !== root).flatMap((m) => (m.children ?? []).map((c) => c.name)));
      const classes = new Map(
        (root.children ?? []).filter((c) => c.kindOf(ReflectionKind.Class) && !elsewhere.has(c.name)).map((c) => [c.name, c]),
      );
      const link = (parts) => {
        for (const part of parts) {
          if (part.kind !== "inline-tag" || part.tag !== "@link" || part.target !== undefined) continue;
          const target = classes.get(part.text.trim());
          if (target !== undefined) part.target = target;
        }
      };
      for (const reflection of Object.values(project.reflections)) {
        if (reflection.comment === undefined) continue;
        link(reflection.comment.summary);
        for (const tag of reflection.comment.blockTags) link(tag.content);
      }
    },
    100, // before TypeDoc's own link resolution (priority -300)
  );
}
