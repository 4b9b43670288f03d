/** The app's Content-Security-Policy (defined once in main/ipc so the browser harness shares it). */
export { contentSecurityPolicy, cspDirectives, securityHeaders } from '../ipc/contentSecurity';
