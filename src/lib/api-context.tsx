import { createContext, useContext } from 'react';
import { httpApi, type Api } from './api';

/** The api the screens read through: the services on the server, HTTP in the browser. */
export const ApiContext = createContext<Api>(httpApi);
export const useApi = () => useContext(ApiContext);
