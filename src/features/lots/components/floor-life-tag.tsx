import type { FloorLifeView } from '../../../../shared/api/lots.ts';
import { StatusTag } from '../../../components/ui/notice.tsx';
import { floorLifeSummary } from './format.ts';

/** Floor-life state as a tag: time left, a warning, or "Bake needed" — in words and colour. */
export function FloorLifeTag({ floorLife }: { floorLife: FloorLifeView }) {
  const s = floorLifeSummary(floorLife);
  return (
    <span title={floorLife.message}>
      <StatusTag tone={s.tone}>{s.text}</StatusTag>
    </span>
  );
}
