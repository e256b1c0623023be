/** Types for the `mavlink` npm package 1.0.1 (Owen McAree's MAVLink 1 codec; it ships none). */
declare module 'mavlink' {
  import { EventEmitter } from 'node:events';
  interface MavlinkMessage {
    id: number;
    system: number;
    component: number;
    length: number;
    payload: Buffer;
    buffer: Buffer;
  }
  class Mavlink extends EventEmitter {
    constructor(sysid: number, compid: number, version?: string, definitions?: string[]);
    parse(bytes: Buffer): void;
    createMessage(msg: string | number, data: Record<string, unknown>, cb: (m: MavlinkMessage) => void): void;
    decodeMessage(m: MavlinkMessage): Record<string, any>;
    getMessageName(id: number): string;
    messageChecksums: number[];
    enums: Array<{ $: { name: string }; entry: Array<{ $: { name: string; value: string } }> }>;
  }
  export = Mavlink;
}
