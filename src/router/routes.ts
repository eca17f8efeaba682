import type { RouteRecordRaw } from 'vue-router';
import type { Role } from '@shared/auth';

declare module 'vue-router' {
  interface RouteMeta {
    /** Who may open the page; absent means everyone, signed in or not. */
    roles?: readonly Role[];
    /** Sign-in and register: a signed-in user is sent to their own home instead. */
    guestOnly?: boolean;
    /** The document title, before " · Saddlestep". */
    title?: string;
  }
}

/** Every route name, so links and redirects are checked by the compiler. */
export const ROUTE = {
  welcome: 'welcome',
  signIn: 'sign-in',
  register: 'register',
  riderHome: 'rider-home',
  fitterHome: 'fitter-home',
  physioHome: 'physio-home',
  adminHome: 'admin-home',
  account: 'account',
  riderAboutMe: 'rider-about-me',
  riderBike: 'rider-bike',
  riderIntake: 'rider-intake',
  myData: 'my-data',
  fitterAvailability: 'fitter-availability',
  book: 'book',
  checkout: 'checkout',
  consultation: 'consultation',
  sessionRoom: 'session-room',
  myPlan: 'my-plan',
  checkIn: 'check-in',
  referralConsent: 'referral-consent',
  physioReferral: 'referral',
  notFound: 'not-found',
} as const;
export type RouteName = (typeof ROUTE)[keyof typeof ROUTE];

/** Query flag a home page turns into the "another kind of account" notice. */
export const WRONG_ROLE_NOTICE = 'wrong-role';

export const routes: RouteRecordRaw[] = [
  { path: '/', name: ROUTE.welcome, component: () => import('@/views/WelcomeView.vue'), meta: { title: 'Bike fit, one small step at a time' } },
  { path: '/sign-in', name: ROUTE.signIn, component: () => import('@/views/SignInView.vue'), meta: { guestOnly: true, title: 'Sign in' } },
  { path: '/register', name: ROUTE.register, component: () => import('@/views/RegisterView.vue'), meta: { guestOnly: true, title: 'Create an account' } },
  { path: '/rider', name: ROUTE.riderHome, component: () => import('@/views/RiderHomeView.vue'), meta: { roles: ['rider'], title: 'My fit' } },
  { path: '/fitter', name: ROUTE.fitterHome, component: () => import('@/views/FitterHomeView.vue'), meta: { roles: ['fitter'], title: 'Today' } },
  { path: '/physio', name: ROUTE.physioHome, component: () => import('@/views/PhysioHomeView.vue'), meta: { roles: ['physio'], title: 'Referrals' } },
  { path: '/admin', name: ROUTE.adminHome, component: () => import('@/views/AdminHomeView.vue'), meta: { roles: ['admin'], title: 'Clinic' } },
  { path: '/account', name: ROUTE.account, component: () => import('@/views/AccountView.vue'), meta: { roles: ['rider', 'fitter', 'physio', 'admin'], title: 'Your account' } },
  // The rider's journey before booking: profile and bikes, then the intake with photos.
  { path: '/rider/about-me', name: ROUTE.riderAboutMe, component: () => import('@/views/AboutMeView.vue'), meta: { roles: ['rider'], title: 'About me · My bikes' } },
  { path: '/rider/bikes/:id(\\d+)', name: ROUTE.riderBike, component: () => import('@/views/BikeView.vue'), meta: { roles: ['rider'], title: 'My bike' } },
  { path: '/rider/tell-us-what-hurts', name: ROUTE.riderIntake, component: () => import('@/views/IntakeView.vue'), meta: { roles: ['rider'], title: 'Tell us what hurts' } },
  { path: '/rider/data', name: ROUTE.myData, component: () => import('@/views/MyDataView.vue'), meta: { roles: ['rider'], title: 'Your data' } },
  // Booking: the fitter's week, the rider's hold → pay → confirmed, and one page per consultation.
  { path: '/fitter/availability', name: ROUTE.fitterAvailability, component: () => import('@/views/FitterAvailabilityView.vue'), meta: { roles: ['fitter'], title: 'Availability' } },
  { path: '/book', name: ROUTE.book, component: () => import('@/views/BookView.vue'), meta: { roles: ['rider'], title: 'Book' } },
  { path: '/consultations/:id(\\d+)/pay', name: ROUTE.checkout, component: () => import('@/views/CheckoutView.vue'), meta: { roles: ['rider'], title: 'Pay for your session' } },
  { path: '/consultations/:id(\\d+)', name: ROUTE.consultation, component: () => import('@/views/ConsultationView.vue'), meta: { roles: ['rider', 'fitter'], title: 'Your session' } },
  // The live session: chat for both, and the fitter's workspace beside it; then the rider's plan.
  { path: '/consultations/:id(\\d+)/room', name: ROUTE.sessionRoom, component: () => import('@/views/SessionRoomView.vue'), meta: { roles: ['rider', 'fitter', 'physio'], title: 'Session room' } },
  { path: '/plan', name: ROUTE.myPlan, component: () => import('@/views/MyPlanView.vue'), meta: { roles: ['rider'], title: 'My plan' } },
  // After rides on a step: the check-in; referrals to a physio, with the rider's agreement first.
  { path: '/plan/check-in', name: ROUTE.checkIn, component: () => import('@/views/CheckInView.vue'), meta: { roles: ['rider'], title: 'Check-in' } },
  { path: '/referrals/:id(\\d+)/consent', name: ROUTE.referralConsent, component: () => import('@/views/ReferralConsentView.vue'), meta: { roles: ['rider'], title: 'Share with a physiotherapist' } },
  { path: '/physio/referrals/:id(\\d+)', name: ROUTE.physioReferral, component: () => import('@/views/PhysioReferralView.vue'), meta: { roles: ['physio'], title: 'Referral' } },
  { path: '/:pathMatch(.*)*', name: ROUTE.notFound, component: () => import('@/views/NotFoundView.vue'), meta: { title: 'Page not found' } },
];
