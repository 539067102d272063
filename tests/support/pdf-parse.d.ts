declare module 'pdf-parse/lib/pdf-parse.js' {
  const parse: unknown;
  export default parse;
}
