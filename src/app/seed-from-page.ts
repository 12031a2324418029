import { queryClient } from '@/lib/query-client';
import { readInitialData, seedInitialData } from './initial-data';

/**
 * The data a pre-rendered page came with, read and put into the query cache as the very first thing
 * (main.tsx imports this before the router, whose loaders would otherwise fetch it again).
 */
export const initialData = readInitialData();
if (initialData) seedInitialData(queryClient, initialData);
