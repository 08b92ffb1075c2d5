// citation-js 0.7 ships no type declarations; these cover the parts Fitledger calls.
declare module "@citation-js/core" {
  export class Cite {
    constructor(data?: unknown, options?: Record<string, unknown>);
    static async(data: unknown, options?: Record<string, unknown>): Promise<Cite>;
    data: unknown[];
    format(format: string, options?: Record<string, unknown>): string | unknown;
  }
  export const plugins: {
    input: {
      add(format: string, parsers: Record<string, unknown>): void;
      get(format: string): unknown;
      has(format: string): boolean;
    };
    config: { get(ref: string): unknown };
  };
}
declare module "@citation-js/plugin-doi" {
  export const parsers: { json: { parse(data: Record<string, unknown>): Record<string, unknown> } };
}
declare module "@citation-js/plugin-bibtex";
declare module "@citation-js/plugin-ris";
declare module "@citation-js/plugin-csl";
