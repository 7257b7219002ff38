// Types for the parts of webvtt-parser 2.2.0 the tests use (the package ships none).
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
}
