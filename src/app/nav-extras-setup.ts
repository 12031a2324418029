import { navExtras } from '@/components/layout/nav-extras';
import { SearchBox } from '@/features/search/components/search-box';

// Fills the header's slots; each feature adds its own line.
navExtras.SearchBox = SearchBox;
