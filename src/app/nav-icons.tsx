import type { NavSection } from '../../shared/auth/roles';

const base = {
  viewBox: '0 0 20 20',
  fill: 'none',
  stroke: 'currentColor',
  strokeWidth: 1.6,
  strokeLinecap: 'round' as const,
  strokeLinejoin: 'round' as const,
  'aria-hidden': true,
};

/** Small line drawings for the navigation, drawn for Crankwise. */
export function NavIcon({ section, className = 'size-4' }: { section: NavSection; className?: string }) {
  const common = { ...base, className: `shrink-0 ${className}` };
  switch (section) {
    case 'cases':
      return (
        <svg {...common}>
          <rect x="3.5" y="4.5" width="13" height="12" rx="1.5" />
          <path d="M7.5 4.5V3h5v1.5M6.5 9h7M6.5 12h4.5" />
        </svg>
      );
    case 'drive-library':
      return (
        <svg {...common}>
          <circle cx="6" cy="13" r="3.2" />
          <circle cx="14" cy="6.5" r="2.2" />
          <path d="M3.4 11.2 12.3 5M8.9 14.4l6.8-6.2" />
        </svg>
      );
    case 'bearings':
      return (
        <svg {...common}>
          <circle cx="10" cy="10" r="6.5" />
          <circle cx="10" cy="10" r="2.5" />
          <circle cx="10" cy="5.6" r="0.9" fill="currentColor" />
          <circle cx="14.4" cy="10" r="0.9" fill="currentColor" />
          <circle cx="10" cy="14.4" r="0.9" fill="currentColor" />
          <circle cx="5.6" cy="10" r="0.9" fill="currentColor" />
        </svg>
      );
    case 'capture-planner':
      return (
        <svg {...common}>
          <path d="M2.5 10h2.5l1.5-4 2.5 8 2-6 1.5 3h5" />
        </svg>
      );
    case 'team':
      return (
        <svg {...common}>
          <circle cx="7.5" cy="7" r="2.5" />
          <path d="M3 16c.6-2.6 2.3-4 4.5-4s3.9 1.4 4.5 4" />
          <circle cx="14" cy="7.5" r="2" />
          <path d="M13.5 11.6c1.7.1 3 1.3 3.5 3.4" />
        </svg>
      );
    case 'outbox':
      return (
        <svg {...common}>
          <rect x="3" y="5" width="14" height="10.5" rx="1.5" />
          <path d="m3.5 6 6.5 5 6.5-5" />
        </svg>
      );
    case 'shop-setup':
      return (
        <svg {...common}>
          <path d="M3.5 8.5 10 4l6.5 4.5V16h-13z" />
          <path d="M8 16v-4h4v4" />
        </svg>
      );
  }
}
