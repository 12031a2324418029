import type { RunChannel } from './vocabulary';

/**
 * Converts one reading from a mapped unit to the channel's own. °F → °C by t/°C = (t/°F − 32) / 1.8
 * (NIST SP 811, Appendix B); electrical rpm ÷ pole pairs = mechanical rpm; milli-units ÷ 1000.
 */
export function toCanonical(channel: RunChannel, unit: string, value: number, poles?: number): number {
  switch (unit) {
    case 'ms':
    case 'mA':
    case 'mV':
      return value / 1000;
    case 'F':
      return (value - 32) / 1.8;
    case 'fraction':
      return value * 100;
    case 'erpm':
      return value / ((poles ?? 2) / 2);
    default:
      void channel;
      return value;
  }
}
