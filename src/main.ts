import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { VueQueryPlugin, QueryClient, QueryCache } from '@tanstack/vue-query';
import PrimeVue from 'primevue/config';
import ConfirmationService from 'primevue/confirmationservice';
import ToastService from 'primevue/toastservice';
import '@fontsource/noto-sans/400.css';
import '@fontsource/noto-sans/500.css';
import '@fontsource/noto-sans/600.css';
import 'primeicons/primeicons.css';
import './theme/app.css';
import { IngotracePreset } from './theme/ingotrace-preset';
import { createAppRouter } from './router';
import { isApiError } from './api/http';
import { sessionKeys } from './api/session';
import App from './App.vue';

const queryClient: QueryClient = new QueryClient({
  defaultOptions: { queries: { staleTime: 15_000, refetchOnWindowFocus: false, retry: 1 } },
  queryCache: new QueryCache({
    // A session that ended (idle time-out, deactivation) sends the person to sign in again.
    onError: (error) => {
      if (isApiError(error) && error.status === 401) {
        queryClient.setQueryData(sessionKeys.me(), null);
        const current = router.currentRoute.value;
        if (!current.meta.public)
          void router.push({ name: 'sign-in', query: { returnTo: current.fullPath, ended: 'session' } });
      }
    },
  }),
});
const router = createAppRouter(queryClient);

createApp(App)
  .use(createPinia())
  .use(router)
  .use(VueQueryPlugin, { queryClient })
  .use(PrimeVue, { theme: { preset: IngotracePreset, options: { darkModeSelector: '.app-dark', cssLayer: false } } })
  .use(ConfirmationService)
  .use(ToastService)
  .mount('#app');
