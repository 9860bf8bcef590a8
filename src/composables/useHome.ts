import { useQuery } from '@tanstack/vue-query';
import { homeQuery } from '../api/home';

export const useHome = () => useQuery(homeQuery());
