import { computed, ref } from 'vue';
import { defineStore } from 'pinia';
import type { AccountSettings, PublicUser, RegisterInput, SignInInput } from '@shared/auth';
import { authApi, type RegisterResult } from '@/api/auth';
import { bindHttpSession } from '@/api/http';

/** Who is signed in, and the CSRF token of their session. */
export const useAuthStore = defineStore('auth', () => {
  const user = ref<PublicUser | null>(null);
  const csrfToken = ref<string | null>(null);
  const loaded = ref(false);
  /** Bumped when the server says the session is gone, so the router can send the user to sign in. */
  const sessionEndedCount = ref(0);
  let loading: Promise<void> | null = null;

  const role = computed(() => user.value?.role ?? null);
  const isSignedIn = computed(() => user.value !== null);

  function forget(): void {
    user.value = null;
    // The token belonged to the old session; a new one is fetched on the next change request.
    csrfToken.value = null;
  }

  bindHttpSession({
    getCsrfToken: () => csrfToken.value,
    setCsrfToken: (token) => {
      csrfToken.value = token;
    },
    onUnauthorized: () => {
      if (!user.value) return;
      forget();
      sessionEndedCount.value += 1;
    },
  });

  /** Asks the server once per page load who we are; later calls reuse the answer. */
  function ensureLoaded(): Promise<void> {
    if (loaded.value) return Promise.resolve();
    loading ??= authApi
      .me()
      .then((me) => {
        user.value = me;
      })
      // Not signed in, or the server is unreachable: either way the visitor starts signed out,
      // and the sign-in form will show the real error if it persists.
      .catch(() => forget())
      .finally(() => {
        loaded.value = true;
        loading = null;
      });
    return loading;
  }

  async function signIn(input: SignInInput): Promise<PublicUser> {
    const result = await authApi.signIn(input);
    // Signing in regenerates the session, so the token from before is no longer valid.
    csrfToken.value = result.csrfToken;
    user.value = result.user;
    loaded.value = true;
    return result.user;
  }

  async function register(input: RegisterInput): Promise<RegisterResult> {
    const result = await authApi.register(input);
    if (result.signedIn) {
      csrfToken.value = result.csrfToken;
      user.value = result.user;
      loaded.value = true;
    }
    return result;
  }

  async function signOut(): Promise<void> {
    try {
      await authApi.signOut();
    } finally {
      // Even if the server could not be reached, this tab stops acting as the user.
      forget();
    }
  }

  async function updateAccount(input: AccountSettings): Promise<PublicUser> {
    user.value = await authApi.updateAccount(input);
    return user.value;
  }

  /** The account no longer exists (the rider erased it): forget it here; there is no session left to end. */
  function forgetDeletedAccount(): void {
    forget();
  }

  return { user, csrfToken, loaded, sessionEndedCount, role, isSignedIn, ensureLoaded, signIn, register, signOut, updateAccount, forgetDeletedAccount };
});
