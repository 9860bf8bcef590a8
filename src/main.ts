import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { VueQueryPlugin, QueryClient } from '@tanstack/vue-query';
import PrimeVue from 'primevue/config';
import '@fontsource/noto-sans/400.css';
import '@fontsource/noto-sans/500.css';
import '@fontsource/noto-sans/600.css';
import 'primeicons/primeicons.css';
import './theme/app.css';
import { IngotracePreset } from './theme/ingotrace-preset';
import { createAppRouter } from './router';
import App from './App.vue';

const queryClient = new QueryClient({
  defaultOptions: { queries: { staleTime: 15_000, refetchOnWindowFocus: false, retry: 1 } },
});

createApp(App)
  .use(createPinia())
  .use(createAppRouter())
  .use(VueQueryPlugin, { queryClient })
  .use(PrimeVue, { theme: { preset: IngotracePreset, options: { darkModeSelector: '.app-dark', cssLayer: false } } })
  .mount('#app');
