import { nextTick, onBeforeUnmount } from 'vue';

/**
 * Gives focus back to what opened a dialog (the button a person pressed) when the dialog goes
 * away, so that a keyboard user carries on from where they were (WCAG 2.1 SC 2.4.3). The
 * dialogs here are mounted and unmounted with their parent's condition, which skips the
 * dialog's own close transition and with it its focus return.
 */
export function useFocusReturn(): void {
  const opener = typeof document !== 'undefined' ? (document.activeElement as HTMLElement | null) : null;
  onBeforeUnmount(() => {
    if (!opener || opener === document.body) return;
    void nextTick(() => {
      if (opener.isConnected) opener.focus();
    });
  });
}
