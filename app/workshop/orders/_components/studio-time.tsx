import { formatInZone } from '@/lib/drops/phase';

/** A moment in the studio's own zone, labelled with the zone's short name ("Sun 29 Mar, 19:00 CEST"). */
export function StudioTime({ at, zone }: { at: string; zone: string }) {
  return (
    <time dateTime={at} className="figures whitespace-nowrap">
      {formatInZone(new Date(at), zone)}
    </time>
  );
}
