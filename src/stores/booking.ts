import { ref } from 'vue';
import { defineStore } from 'pinia';

/**
 * What the booking pages hand to each other within one visit. Kept in memory on purpose: the
 * "you are booked" moment belongs to the payment just made, not to a link opened later.
 */
export const useBookingStore = defineStore('booking', () => {
  /** The consultation just paid for, so its page opens with the confirmation. */
  const justBookedId = ref<number | null>(null);

  function markBooked(id: number): void {
    justBookedId.value = id;
  }

  function clearBooked(): void {
    justBookedId.value = null;
  }

  return { justBookedId, markBooked, clearBooked };
});
