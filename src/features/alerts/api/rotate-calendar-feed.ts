import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Creates the person's private calendar feed URL, or replaces it (the old one stops working). */
export const rotateCalendarFeed = () => api.post<{ url: string }>('/me/calendar-feed');

export function useRotateCalendarFeed() {
  return useMutation({ mutationFn: rotateCalendarFeed });
}
