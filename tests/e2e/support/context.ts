// What the e2e global setup hands to every test file through vitest's provide/inject.
declare module "vitest" {
  export interface ProvidedContext {
    e2e: { enabled: boolean; baseUrl: string; mailUrl: string; doiUrl: string; databaseUrl: string };
  }
}

export {};
