-- The screen synonyms that say "backing" quote it too (see 0015): "green screen" then finds pages
-- that say "green backing" without marking every "back" on them. Only rows still as 0009 seeded them.
UPDATE "thesaurus_entries" SET "terms" = ARRAY['green screen', 'greenscreen', '"green backing"', 'green wall', 'chroma green']::text[]
  WHERE "kind" = 'synonyms' AND "terms" = ARRAY['green screen', 'greenscreen', 'green backing', 'green wall', 'chroma green']::text[];
--> statement-breakpoint
UPDATE "thesaurus_entries" SET "terms" = ARRAY['blue screen', 'bluescreen', '"blue backing"', 'blue wall', 'chroma blue']::text[]
  WHERE "kind" = 'synonyms' AND "terms" = ARRAY['blue screen', 'bluescreen', 'blue backing', 'blue wall', 'chroma blue']::text[];
--> statement-breakpoint
UPDATE "thesaurus_entries" SET "terms" = ARRAY['uneven screen', 'patchy screen', 'blotchy screen', 'screen falloff', '"uneven backing"', 'uneven lighting on the screen']::text[]
  WHERE "kind" = 'synonyms' AND "terms" = ARRAY['uneven screen', 'patchy screen', 'blotchy screen', 'screen falloff', 'uneven backing', 'uneven lighting on the screen']::text[];
