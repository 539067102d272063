/** How an uncertainty reads on screen (pure). */
import type { Uncertainty } from '~/lib/carbon';

export function uncertaintyText(u: Uncertainty): string {
  switch (u.kind) {
    case 'none':
      return '—';
    case 'percent':
      return `±${u.plusMinusPercent}%${u.basis === 'two-sd' ? ' (2 SD)' : ''}${u.standIn ? ' *' : ''}`;
    case 'range':
      return `${u.low}–${u.high}${u.standIn ? ' *' : ''}`;
    case 'plus-minus':
      return `±${u.plusMinus}`;
  }
}
