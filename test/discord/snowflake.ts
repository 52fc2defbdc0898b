/**
 * Discord ids are snowflakes: milliseconds since the Discord epoch (2015-01-01T00:00:00Z, 1420070400000 ms;
 * Discord developer docs, "Snowflakes"; value from memory) shifted left 22 bits, plus worker/process/increment
 * bits. discord.js reads an interaction's createdTimestamp from its id, so test ids carry a real time.
 */
const DISCORD_EPOCH = 1_420_070_400_000n;
let increment = 0n;

export function snowflake(ms: number): string {
  increment = (increment + 1n) & 0xfffn;
  return (((BigInt(Math.floor(ms)) - DISCORD_EPOCH) << 22n) | increment).toString();
}
