import { QueryClientProvider } from "@tanstack/react-query";
import { StrictMode } from "react";
import { createRoot } from "react-dom/client";
import { RouterProvider, createBrowserRouter } from "react-router";
import { createQueryClient } from "./app/queryClient";
import { buildRoutes } from "./app/router";
import "./styles/app.css";

const queryClient = createQueryClient();
const router = createBrowserRouter(buildRoutes(queryClient));

createRoot(document.getElementById("root")!).render(
  <StrictMode>
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  </StrictMode>,
);
