-- "spark" (set slang for an electrician) leaves the crew entry: its stem is also that of "sparks"
-- from a grinder or a fire, so "sparks flying past the lens" reached crew removal. Only the row still
-- exactly as 0009 seeded it changes: a lead's edits stand.
UPDATE "thesaurus_entries" SET "terms" = ARRAY['person', 'people', 'someone', 'somebody', 'bystander', 'passer-by', 'pedestrian', 'onlooker', 'grip', 'camera operator', 'crew member']::text[]
  WHERE "kind" = 'narrower' AND "broader" = 'crew' AND "terms" = ARRAY['person', 'people', 'someone', 'somebody', 'bystander', 'passer-by', 'pedestrian', 'onlooker', 'grip', 'camera operator', 'crew member', 'spark']::text[];
