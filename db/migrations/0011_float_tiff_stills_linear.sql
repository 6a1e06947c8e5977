-- Float TIFF stills hold scene-linear values (libvips reads them as scRGB: linear, sRGB primaries).
-- Stills uploaded before colour spaces were declared get that space; everything else stays sRGB-encoded.
UPDATE "stills" SET "colour_space" = 'lin-rec709' WHERE "bit_depth" = 32 AND "format" = 'tiff';
