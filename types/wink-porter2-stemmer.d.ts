declare module "wink-porter2-stemmer" {
  /** Porter2 (the English Snowball stemmer) of one lower-case word. */
  export default function stem(word: string): string;
}
