// Types for the parts of webvtt-parser 2.2.0 we use (the package ships none). It is CommonJS that
// assigns its exports inside a function, so Node's ESM loader sees only the default export: the
// app imports `webvtt from 'webvtt-parser'` (tests run through Vite, where named imports work too).
declare module 'webvtt-parser' {
  export interface ParsedCue {
    id: string;
    startTime: number;
    endTime: number;
    text: string;
  }
  export interface ParseResult {
    cues: ParsedCue[];
    errors: { message: string; line: number; col?: number }[];
  }
  export class WebVTTParser {
    parse(input: string, mode?: 'metadata' | 'chapters'): ParseResult;
  }
  const webvtt: { WebVTTParser: typeof WebVTTParser };
  export default webvtt;
}
