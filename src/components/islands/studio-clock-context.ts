import { createContext, useContext } from 'react';
import { DEFAULT_CLOCK, type StudioClock } from '~/lib/time/date-format';

/** The studio's zone and locale for islands, given once where the island is mounted. */
export const StudioClockContext = createContext<StudioClock>(DEFAULT_CLOCK);

export const useStudioClock = (): StudioClock => useContext(StudioClockContext);
