import { hasRole } from '@shared/constants';
import { navExtras } from '@/components/layout/nav-extras';
import { useCurrentUser } from '@/features/auth/api/auth';
import { ReviewCountBadge } from '@/features/review/components/review-badge';
import { SearchBox } from '@/features/search/components/search-box';

function ReviewBadge() {
  const me = useCurrentUser().data;
  return <ReviewCountBadge enabled={hasRole(me, 'moderator')} />;
}

// Fills the header's slots once at startup (imported by main.tsx), so the layout never imports a feature itself.
navExtras.SearchBox = SearchBox;
navExtras.ReviewBadge = ReviewBadge;
