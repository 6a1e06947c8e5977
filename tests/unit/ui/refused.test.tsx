import { renderToStaticMarkup } from "react-dom/server";
import { expect, test } from "vitest";

import { Refused } from "@/components/ui/refused";

/* The 403 page tells people where to go next. An admin is told who does the work instead of being
   sent to "ask an admin" (roles: shared/PRODUCT.md). */

test("sends an artist to an admin", () => {
  const html = renderToStaticMarkup(<Refused role="artist" />);
  expect(html).toContain("open to other roles than artist");
  expect(html).toContain("ask an admin");
});

test("tells an admin which roles write and review instead of sending them to themselves", () => {
  const html = renderToStaticMarkup(<Refused role="admin" />);
  expect(html).not.toContain("ask an admin");
  expect(html).toContain("writing and reviewing techniques is for seniors and leads");
});
