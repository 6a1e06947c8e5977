-- Quoted terms are met only by their words as written (lib/search/thesaurus.ts). Two starter terms
-- need it: "backing" (a screen; the stemmer makes it "back") and "cross" (a tape mark; "crossing").
-- Only rows still exactly as 0009 seeded them change: a lead's edits stand.
UPDATE "thesaurus_entries" SET "terms" = ARRAY['tracker', 'tracking dot', 'tracking point', 'tape cross', 'tape mark', 'x mark', '"cross"', 'dot', 'ping pong ball', 'witness mark']::text[]
  WHERE "kind" = 'narrower' AND "broader" = 'marker' AND "terms" = ARRAY['tracker', 'tracking dot', 'tracking point', 'tape cross', 'tape mark', 'x mark', 'cross', 'dot', 'ping pong ball', 'witness mark']::text[];
--> statement-breakpoint
UPDATE "thesaurus_entries" SET "terms" = ARRAY['"backing"', 'backdrop', 'cyc', 'cyclorama']::text[]
  WHERE "kind" = 'narrower' AND "broader" = 'screen' AND "terms" = ARRAY['backing', 'backdrop', 'cyc', 'cyclorama']::text[];
