// WordNet 3.0's exception lists as wink-lexicon ships them: an irregular form → its base form.
declare module "wink-lexicon/src/wn-noun-exceptions.js" {
  const exceptions: Readonly<Record<string, string>>;
  export default exceptions;
}
declare module "wink-lexicon/src/wn-verb-exceptions.js" {
  const exceptions: Readonly<Record<string, string>>;
  export default exceptions;
}
declare module "wink-lexicon/src/wn-adjective-exceptions.js" {
  const exceptions: Readonly<Record<string, string>>;
  export default exceptions;
}
