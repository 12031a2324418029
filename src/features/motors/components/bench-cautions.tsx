import { Notice } from '@/components/ui/notice';

/** The usual cautions for a motor spinning free on the bench, at the point where checks are taken. */
export function BenchCautions() {
  return (
    <Notice tone="caution" title="On the bench">
      A motor spinning without load reaches its highest speed: remove the pinion or keep it covered, clamp the motor down, and keep fingers, hair and loose
      cables away from the shaft. A motor that has just run can be too hot to touch — let it cool before taking it apart or reading its resistance. Stay within
      the motor maker&rsquo;s voltage and speed limits and follow their instructions for disassembly, and the track&rsquo;s rules for bench running in the pits.
    </Notice>
  );
}
