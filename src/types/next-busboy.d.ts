// Next's own copy of busboy, the multipart reader its server-action handler reads forms with
// (src/server/action-body.ts reads a form exactly as that handler will). Only what is used.
declare module "next/dist/compiled/busboy" {
  import type { Writable, Readable } from "node:stream";
  type Busboy = Writable & {
    on(event: "field", listener: (name: string, value: string) => void): Busboy;
    on(event: "file", listener: (name: string, stream: Readable) => void): Busboy;
    on(event: "error", listener: (error: unknown) => void): Busboy;
    on(event: "close", listener: () => void): Busboy;
  };
  export default function busboy(config: { headers: Record<string, string>; defParamCharset?: string; limits?: { fieldSize?: number } }): Busboy;
}
