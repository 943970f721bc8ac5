// Pure and client-safe: times shown and typed in one named IANA time zone (the server's setting,
// GATEWELL_TIME_ZONE, UTC unless set), with the zone always shown beside them.

/** Whether a name is an IANA time zone this runtime knows. */
export function isTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

const formatters = new Map<string, Intl.DateTimeFormat>();
function partsFormatter(zone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(zone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat('en-GB', {
      timeZone: zone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    formatters.set(zone, formatter);
  }
  return formatter;
}

/** How far the zone's wall clock is ahead of UTC at a moment, in milliseconds. */
export function zoneOffsetMs(moment: Date, zone: string): number {
  const parts = Object.fromEntries(
    partsFormatter(zone)
      .formatToParts(moment)
      .map((part) => [part.type, part.value]),
  );
  const wall = Date.UTC(
    Number(parts.year),
    Number(parts.month) - 1,
    Number(parts.day),
    Number(parts.hour),
    Number(parts.minute),
    Number(parts.second),
  );
  const whole = moment.getTime() - (moment.getTime() % 1000);
  return wall - whole;
}

/**
 * The moment a wall-clock time in a zone names, given as the same wall-clock time read as UTC. In the
 * hour skipped when clocks go forward it lands an hour later; in the hour repeated when they go back it
 * takes the earlier of the two.
 */
export function wallClockToUtc(wallAsUtc: Date, zone: string): Date {
  const wall = wallAsUtc.getTime();
  const day = 86_400_000;
  const before = wall - zoneOffsetMs(new Date(wall - day), zone);
  const after = wall - zoneOffsetMs(new Date(wall + day), zone);
  const shows = (moment: number) => moment + zoneOffsetMs(new Date(moment), zone) === wall;
  const valid = [before, after].filter(shows);
  // A skipped wall-clock time is read with the offset in force before the change: an hour later.
  return new Date(valid.length ? Math.min(...valid) : before);
}

/** A moment as a person reads it in the zone: `Sat, 5 Dec 2026, 09:31:00 CET`. */
export function formatInZone(moment: Date | string, zone: string): string {
  const date = typeof moment === 'string' ? new Date(moment) : moment;
  return new Intl.DateTimeFormat('en-GB', {
    timeZone: zone,
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
    hourCycle: 'h23',
    timeZoneName: 'short',
  }).format(date);
}

/** A moment as `YYYY-MM-DDTHH:MM:SS` on the zone's wall clock (for a datetime-local field or a sheet). */
export function wallClockText(moment: Date | string, zone: string): string {
  const date = typeof moment === 'string' ? new Date(moment) : moment;
  return new Date(date.getTime() + zoneOffsetMs(date, zone)).toISOString().slice(0, 19);
}
