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

const pinia = createPinia();
const router = createAppRouter(pinia);
// The one chat socket follows the session: open after sign-in, closed on sign-out.
useChatStore(pinia).start();

createApp(App).use(pinia).use(router).mount('#app');
