import { defineStore } from 'pinia';
import { ref } from 'vue';

/** Client-only layout state: whether the navigation rail is open on narrow screens. */
export const useLayoutStore = defineStore('layout', () => {
  const navigationOpen = ref(false);
  function toggleNavigation() {
    navigationOpen.value = !navigationOpen.value;
  }
  function closeNavigation() {
    navigationOpen.value = false;
  }
  return { navigationOpen, toggleNavigation, closeNavigation };
});
