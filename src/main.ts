import { createApp } from 'vue'
import { createPinia } from 'pinia'
import App from './App.vue'
import { router } from './router'
import { setUnauthorizedHandler } from './api/http'
import { useAuthStore } from './stores/auth'
import './styles/base.css'
import { installA11yFixups } from './lib/a11y-fixups'

const app = createApp(App)
// Pinia first: the router guard uses the auth store.
app.use(createPinia())
app.use(router)

setUnauthorizedHandler(() => {
  useAuthStore().clear()
  if (!router.currentRoute.value.meta.public) void router.push({ name: 'sign-in', query: { next: router.currentRoute.value.fullPath } })
})

app.mount('#app')
installA11yFixups()
