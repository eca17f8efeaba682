import { createApp } from 'vue';
import { createPinia } from 'pinia';
// Lato ships inside the bundle: the app loads nothing from any other origin.
import '@fontsource/lato/400.css';
import '@fontsource/lato/400-italic.css';
import '@fontsource/lato/700.css';
import './styles/theme.css';
import './styles/base.css';
import App from './App.vue';
import { createAppRouter } from './router';
import { useChatStore } from './stores/chat';
import { useCareAlertsStore } from './stores/care-alerts';

const pinia = createPinia();
const router = createAppRouter(pinia);
// The one chat socket follows the session: open after sign-in, closed on sign-out.
useChatStore(pinia).start();
// Care alerts listen on the same socket: a notification with a link, and open lists refresh.
useCareAlertsStore(pinia).start(router);

createApp(App).use(pinia).use(router).mount('#app');
